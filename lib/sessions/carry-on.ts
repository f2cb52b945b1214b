// Where the add-run form carries on from: a train's next run starts where its last one left it.
// Client-safe (no server imports).
import type { FastClock } from '@/lib/planning';
import { formatTimeOfDay, realToFast } from '@/lib/planning/clock';

type RunLike = { trainId: string; departS: number; arriveS: number; steps: readonly { blockId: string; exitS: number }[] };

export type CarryOn = {
  /** The first whole fast minute at which the train can depart again, `HH:MM`. */
  depart: string;
  /** The block the train stands in after its last run: the next route starts there. */
  fromBlockId: string;
};

/**
 * The next run of a train carries on from its last one (the run arriving last): it starts in the
 * block that run stopped in, and departs at the first whole fast minute that leaves the new run's
 * stand before departure (`standBeforeS`, real seconds) after the last run's stand after arriving,
 * so the two stands do not overlap. Undefined when the train has no runs yet.
 */
export function carryOnFrom(runs: readonly RunLike[], trainId: string, clock: FastClock, standBeforeS: number): CarryOn | undefined {
  let last: RunLike | undefined;
  for (const run of runs) {
    if (run.trainId !== trainId || run.steps.length === 0) continue;
    if (!last || run.arriveS > last.arriveS || (run.arriveS === last.arriveS && run.departS > last.departS)) last = run;
  }
  if (!last) return undefined;
  const lastStep = last.steps[last.steps.length - 1]!;
  const freeS = Math.max(last.arriveS, lastStep.exitS) + Math.max(0, standBeforeS);
  // A hair under a whole minute still rounds up to it; a time already on the minute stays.
  const fastS = Math.ceil(realToFast(freeS, clock) / 60 - 1e-9) * 60;
  return { depart: formatTimeOfDay(fastS), fromBlockId: lastStep.blockId };
}
