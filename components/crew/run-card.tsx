import { formatStand, type RunAssignment } from '@/lib/invitations/assignments';

function Neighbour({ label, n, viewerId }: { label: string; n: RunAssignment['before']; viewerId: string }) {
  return (
    <div className="min-w-0">
      <dt className="text-xs text-muted">{label}</dt>
      <dd className="text-sm">
        {n ? (
          <>
            <span className="block font-semibold">{n.operatorId === viewerId ? 'You' : (n.operatorName ?? 'no one named')}</span>
            <span className="block text-muted">
              {n.trainName} · {n.fastDepart}
            </span>
          </>
        ) : (
          <span className="text-muted">no one</span>
        )}
      </dd>
    </div>
  );
}

/** One of my runs as read on a phone: fast departure large, then train, cab, route and hand-overs. */
export function RunCard({ run, index, viewerId }: { run: RunAssignment; index: number; viewerId: string }) {
  return (
    <li className="rounded-plate border border-line bg-surface p-4 shadow-sm" data-testid="my-run">
      <div className="flex items-start justify-between gap-3">
        <div>
          <p className="text-xs font-semibold uppercase tracking-widest text-brass">Run {index + 1} · fast clock</p>
          <p className="font-display text-3xl font-bold leading-tight" data-testid="my-run-fast">
            {run.fastDepart}
            <span className="text-lg font-semibold text-muted"> → {run.fastArrive}</span>
          </p>
          <p className="text-sm text-muted">
            Real time {run.realDepart} → {run.realArrive}
          </p>
        </div>
        <div className="text-right">
          <p className="rounded-plate bg-verdigris-soft px-2 py-1 text-sm font-bold text-verdigris-strong" data-testid="my-run-cab">
            {run.cabName}
          </p>
        </div>
      </div>
      <p className="mt-2 text-lg font-semibold" data-testid="my-run-train">{run.trainName}</p>
      <ol className="mt-2 flex flex-wrap items-center gap-1 text-xs" aria-label="Route, blocks in order">
        {run.route.map((block, i) => (
          <li key={`${block}-${i}`} className="flex items-center gap-1">
            {i > 0 ? <span aria-hidden className="text-muted">→</span> : null}
            <span className="rounded bg-sunken px-1.5 py-0.5 font-semibold">{block}</span>
          </li>
        ))}
      </ol>
      <p className="mt-2 text-sm">
        Stand {formatStand(run.standBeforeS)} before departure · {formatStand(run.standAfterS)} after arrival
      </p>
      <dl className="mt-3 grid grid-cols-2 gap-3 border-t border-line pt-3">
        <Neighbour label={`Before me on ${run.cabName}`} n={run.before} viewerId={viewerId} />
        <Neighbour label={`After me on ${run.cabName}`} n={run.after} viewerId={viewerId} />
      </dl>
      {run.note ? <p className="mt-2 text-sm text-muted">{run.note}</p> : null}
    </li>
  );
}
