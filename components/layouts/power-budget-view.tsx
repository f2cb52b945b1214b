import { Badge } from '@/components/ui/card';
import type { PowerBudget, Status, WorstCase } from '@/lib/layouts/power-budget';

const A = (v: number) => `${Math.round(v * 1000) / 1000} A`;
const V = (v: number) => `${Math.round(v * 100) / 100} V`;
const W = (v: number) => `${Math.round(v * 100) / 100} W`;
const TONE = { ok: 'good', warning: 'warn', over: 'bad' } as const;
const LABEL: Record<Status, string> = { ok: 'within ratings', warning: 'check', over: 'over a rating' };

function Sum({ worst, empty }: { worst: WorstCase; empty: string }) {
  if (worst.terms.length === 0) return <span className="text-muted">{empty}</span>;
  return (
    <span>
      {worst.terms.map((t, i) => (
        <span key={i}>
          {i ? ' + ' : ''}
          {A(t.amps)} <span className="text-muted">({t.trainName})</span>
        </span>
      ))}
      {worst.terms.length > 1 ? <strong> = {A(worst.amps)}</strong> : null}
    </span>
  );
}

/**
 * Every figure with where it comes from: typed in (supplies, drivers, locomotives, trains), a sum of
 * those, the 80 % rule, a preset's datasheet, or NEM 630 / NMRA S-9 for the track voltage.
 */
export function PowerBudgetView({ budget }: { budget: PowerBudget }) {
  const pct = Math.round(budget.derate * 100);
  return (
    <div className="space-y-6" data-testid="power-budget">
      <p className="text-sm text-muted">
        Worst case before any timetable: every cab runs at once, each with a different train, heaviest first (a train is on one cab at a time). Running
        current is compared with {pct} % of a supply&apos;s rating — continuous loads are best kept to 80 % (rule of thumb; the same figure as NEC 210.20(A) for
        breakers) — and start-up surge with the full rating. A start draws the stall current scaled by the locomotive&apos;s start voltage (a PWM ramp holds the motor
        below it until it turns); without a start voltage, the full stall current. Train currents are the locomotives&apos; and lighting figures you typed.
      </p>
      <section className="space-y-3">
        <h3 className="font-display text-base font-bold">Supplies</h3>
        {budget.supplies.length === 0 ? <p className="text-sm text-muted">No supplies yet.</p> : null}
        {budget.supplies.map((s) => (
          <article key={s.id} className="rounded-plate border border-line p-3" data-testid="supply-budget">
            <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
              <h4 className="font-semibold">
                {s.name} <span className="font-normal text-muted">· {V(s.volts)}</span>
              </h4>
              <Badge tone={TONE[s.status]}>{LABEL[s.status]}</Badge>
            </header>
            <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
              <dt className="text-muted">Rated</dt>
              <dd>{A(s.ratedAmps)} <span className="text-muted">(typed in)</span></dd>
              <dt className="text-muted">Derated ({pct} %)</dt>
              <dd>{A(s.ratedAmps)} × {budget.derate} = <strong>{A(s.deratedAmps)}</strong></dd>
              <dt className="text-muted">Worst case running</dt>
              <dd>
                <Sum worst={s.worstRunning} empty={s.cabCount ? 'no trains yet' : 'no cab on this supply'} /> <span className="text-muted">({s.cabCount} cab{s.cabCount === 1 ? '' : 's'})</span>
              </dd>
              <dt className="text-muted">Worst case surge</dt>
              <dd><Sum worst={s.worstSurge} empty="—" /></dd>
              <dt className="text-muted">Headroom</dt>
              <dd className={s.headroomAmps < 0 ? 'font-semibold text-signal' : ''}>
                {A(s.deratedAmps)} − {A(s.worstRunning.amps)} = {A(s.headroomAmps)}
              </dd>
            </dl>
            {s.messages.length ? (
              <ul className="mt-2 list-inside list-disc text-sm text-signal">
                {s.messages.map((m) => <li key={m}>{m}</li>)}
              </ul>
            ) : null}
          </article>
        ))}
      </section>
      <section className="space-y-3">
        <h3 className="font-display text-base font-bold">Drivers</h3>
        {budget.drivers.length === 0 ? <p className="text-sm text-muted">No drivers yet.</p> : null}
        {budget.drivers.map((d) => (
          <article key={d.id} className="rounded-plate border border-line p-3" data-testid="driver-budget">
            <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
              <h4 className="font-semibold">
                {d.name} <span className="font-normal text-muted">· on {d.supplyName} · {d.cabCount} of {d.channels} channel{d.channels === 1 ? '' : 's'} used</span>
              </h4>
              <Badge tone={TONE[d.status]}>{LABEL[d.status]}</Badge>
            </header>
            <p className="mb-2 text-xs text-muted">
              {d.preset ? (
                <>
                  Class: {d.preset.label}
                  {d.preset.edited ? ' (ratings edited by hand)' : ''} — figures from {d.preset.source}. {d.preset.note}
                </>
              ) : (
                'Ratings typed in by hand.'
              )}
              {d.partNumber ? ` Your part: ${d.partNumber}.` : ''}
            </p>
            <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
              <dt className="text-muted">One channel, running</dt>
              <dd>
                <Sum worst={d.channelRunning} empty={d.cabCount ? 'no trains yet' : 'no cab yet'} /> against {A(d.channelAmps)} continuous
              </dd>
              <dt className="text-muted">One channel, surge</dt>
              <dd>
                <Sum worst={d.channelSurge} empty="—" /> against{' '}
                {d.surgeJudgedContinuous ? (
                  <>
                    {A(d.surgeLimitAmps)} continuous{' '}
                    <span className="text-muted">
                      (the {A(d.channelPeakAmps)} peak holds {d.peakPulseMs === null ? 'for no stated time' : `${d.peakPulseMs} ms`}, shorter than the start-up surge)
                    </span>
                  </>
                ) : (
                  `${A(d.surgeLimitAmps)} peak`
                )}
              </dd>
              <dt className="text-muted">All channels, surge</dt>
              <dd>
                <Sum worst={d.worstSurge} empty="—" /> against{' '}
                {d.totalAmps === null ? <span className="text-muted">no total rating (the channel ratings bind)</span> : `${A(d.totalAmps)} total`}
              </dd>
              <dt className="text-muted">Heat in the bridge</dt>
              <dd>
                {d.heatHighWatts === 0 ? (
                  <span className="text-muted">no train yet</span>
                ) : (
                  <>
                    {W(d.heatLowWatts)} to {W(d.heatHighWatts)} <span className="text-muted">(drop × current, least to greatest drop, summed over channels)</span> against{' '}
                    {d.packageWatts === null ? <span className="text-muted">no package rating entered</span> : `${W(d.packageWatts)} package rating`}
                  </>
                )}
              </dd>
              <dt className="text-muted">Track voltage</dt>
              <dd>
                {V(d.supplyVolts)} supply − {V(d.dropVolts)} bridge drop at {A(d.channelRunning.amps)} = <strong>{V(d.trackVolts)}</strong> at full throttle
                {d.nominalVolts !== null ? (
                  <span className="text-muted">
                    {' '}
                    (NEM 630 Table 1: {d.nominalVolts} V nominal for {d.gaugeMm} mm gauge{d.nominalVolts === 12 ? '; NMRA S-9 I.A: at least 12 V' : ''})
                  </span>
                ) : (
                  <span className="text-muted"> (own scale: no standard gauge to judge by)</span>
                )}
              </dd>
            </dl>
            {d.messages.length ? (
              <ul className="mt-2 list-inside list-disc text-sm text-signal">
                {d.messages.map((m) => <li key={m}>{m}</li>)}
              </ul>
            ) : null}
          </article>
        ))}
      </section>
    </div>
  );
}
