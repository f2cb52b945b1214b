'use client';

import type { TimetableLayout } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';
import { Badge } from '@/components/ui/card';

/** Each operator's share of the session: runs, minutes at the controls (real), and whether they declined. */
export function CrewLoad({ runs, layout, ratio }: { runs: Run[]; layout: TimetableLayout; ratio: number }) {
  const load = new Map<string, { runs: number; seconds: number }>();
  let unassigned = 0;
  for (const run of runs) {
    if (!run.operatorId) {
      unassigned += 1;
      continue;
    }
    const entry = load.get(run.operatorId) ?? { runs: 0, seconds: 0 };
    entry.runs += 1;
    entry.seconds += run.arriveS - run.departS;
    load.set(run.operatorId, entry);
  }
  const crew = layout.operators.filter((o) => load.has(o.id) || o.reply !== null);
  return (
    <section className="rounded-plate border border-line bg-surface p-4 shadow-sm" data-testid="crew-load">
      <h2 className="mb-2 font-display text-lg font-bold">Crew</h2>
      {crew.length === 0 ? <p className="text-sm text-muted">No operator assigned yet.</p> : null}
      <ul className="space-y-1 text-sm">
        {crew.map((o) => {
          const l = load.get(o.id);
          return (
            <li key={o.id} className="flex flex-wrap items-center justify-between gap-2">
              <span>
                {o.name}
                {o.reply === 'declined' && l ? <Badge tone="bad">declined, still has runs</Badge> : null}
                {o.reply === 'declined' && !l ? <span className="ml-1"><Badge tone="neutral">declined</Badge></span> : null}
              </span>
              <span className="tabular-nums text-muted">
                {l ? `${l.runs} run${l.runs === 1 ? '' : 's'} · ${Math.round((l.seconds * ratio) / 60)} fast min` : 'no runs'}
              </span>
            </li>
          );
        })}
      </ul>
      {unassigned ? <p className="mt-2 text-sm text-amber">{unassigned} run{unassigned === 1 ? ' has' : 's have'} no operator yet.</p> : null}
    </section>
  );
}
