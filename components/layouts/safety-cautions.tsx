/** The safety cautions every power page shows (from the project's domain notes). */
export function SafetyCautions() {
  return (
    <aside className="rounded-plate border border-amber/40 bg-amber-soft p-4 text-sm" aria-label="Safety" data-testid="safety-cautions">
      <h3 className="mb-2 font-display font-bold text-amber">Safety</h3>
      <ul className="list-inside list-disc space-y-1 text-ink">
        <li>Mains-side work (turning AC into the DC supply) is hazardous: use enclosed, certified supplies; leave mains wiring to a qualified person; follow local electrical codes.</li>
        <li>Fuse or current-limit every supply output; an overloaded supply or driver overheats.</li>
        <li>Driver heat sinks can reach burn temperatures; allow airflow.</li>
        <li>Never switch both transistors of one side of an H-bridge on together: it shorts the supply (shoot-through). Prefer driver chips with built-in protection.</li>
        <li>Outdoor layouts: low voltage only on the track, weatherproof connections, residual-current protection on the mains side.</li>
        <li>Fishplate&apos;s figures are planning aids, not a substitute for the manufacturer&apos;s ratings, local codes or a licensed electrician.</li>
      </ul>
    </aside>
  );
}
