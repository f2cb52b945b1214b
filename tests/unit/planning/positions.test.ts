/**
 * Where each train is at a moment (the track diagram's markers), by the occupancy rule `checkPlan`
 * checks block clashes with: a worked example by hand, and a property against `checkPlan` itself.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkPlan, type Plan } from '@/lib/planning';
import { trainPositionsAt } from '@/lib/planning/positions';
import { planArbitrary } from './plan-arbitrary';

type Spec = { id: string; trainId: string; departS: number; steps: [string, number, number][] };
const runs = (specs: Spec[]) => specs.map((s) => ({ ...s, steps: s.steps.map(([blockId, enterS, exitS]) => ({ blockId, enterS, exitS })) }));

/*
 * Worked example (a line Yard – Main – Station; times are real seconds from the session's start,
 * the session lasts 1000 s):
 *   Goods (train G): run g1 departs at 100 s: Yard 40–130 (stands 60 s before departing), Main
 *   120–200 (the head enters at 120 s while the tail is still in Yard until 130 s), Station 190–260
 *   (stands after arriving). Its run g2 departs at 600 s: Station 540–640, Main 630–700.
 *   Railcar (train R): run r1 departs at 300 s: Station 300–330, Main 320–400, Yard 390–450.
 * By hand:
 *   t = 0     G stands in Yard (before g1, from the session's start); R stands in Station (before r1).
 *   t = 125   G is in Yard and Main (head in Main, tail in Yard): running; R still in Station.
 *   t = 250   G in Station (arrival stand, a step of g1); R standing in Station: both there.
 *   t = 500   G stands in Station between g1 and g2 (260–540); R stands in Yard after r1.
 *   t = 700   G stands in Main after its last run (from 700 s to the session's end); R in Yard.
 *   t = 1000  the session is over: nobody is anywhere.
 */
const example = runs([
  { id: 'g1', trainId: 'G', departS: 100, steps: [['Yard', 40, 130], ['Main', 120, 200], ['Station', 190, 260]] },
  { id: 'g2', trainId: 'G', departS: 600, steps: [['Station', 540, 640], ['Main', 630, 700]] },
  { id: 'r1', trainId: 'R', departS: 300, steps: [['Station', 300, 330], ['Main', 320, 400], ['Yard', 390, 450]] },
]);

describe('trainPositionsAt: worked example', () => {
  const at = (t: number) => Object.fromEntries(trainPositionsAt(example, t, 1000).map((p) => [p.trainId, [p.state, ...p.blockIds].join(' ')]));
  it('places each train as worked out by hand', () => {
    expect(at(0)).toEqual({ G: 'standing Yard', R: 'standing Station' });
    expect(at(125)).toEqual({ G: 'running Yard Main', R: 'standing Station' });
    expect(at(250)).toEqual({ G: 'running Station', R: 'standing Station' });
    expect(at(500)).toEqual({ G: 'standing Station', R: 'standing Yard' });
    expect(at(700)).toEqual({ G: 'standing Main', R: 'standing Yard' });
    expect(at(1000)).toEqual({});
  });
  it('names the run that places a train, and takes a step as [enter, exit)', () => {
    const g = (t: number) => trainPositionsAt(example, t, 1000).find((p) => p.trainId === 'G')!;
    expect(g(500).runId).toBe('g1');
    expect(g(540).runId).toBe('g2');
    expect(g(540).state).toBe('running');
    // At 130 s the tail has left Yard (exit is exclusive).
    expect(g(130).blockIds).toEqual(['Main']);
    // Without a session end, the last step's exit of the whole plan ends it (as in checkPlan).
    expect(trainPositionsAt(example, 699, undefined).find((p) => p.trainId === 'G')!.blockIds).toEqual(['Main']);
    expect(trainPositionsAt(example, 700, undefined)).toEqual([]);
  });
});

describe('trainPositionsAt against checkPlan', () => {
  it('two trains placed in one block at a moment always make a block clash there that covers the moment', () => {
    fc.assert(
      fc.property(planArbitrary(), fc.array(fc.integer({ min: -5, max: 200 }), { minLength: 1, maxLength: 8 }), (plan: Plan, times) => {
        const check = checkPlan(plan);
        fc.pre(!check.truncated);
        const clashes = check.findings.filter((f) => f.kind === 'block-overlap' || f.kind === 'block-occupied');
        for (const t of times) {
          const positions = trainPositionsAt(plan.runs, t, plan.sessionEndS);
          const seen = new Map<string, string>();
          for (const p of positions) {
            for (const block of p.blockIds) {
              const other = seen.get(block);
              if (other !== undefined && other !== p.trainId) {
                expect(clashes.some((f) => f.ids[0] === block && f.fromS <= t && t <= f.toS)).toBe(true);
              }
              seen.set(block, p.trainId);
            }
          }
        }
      }),
      { numRuns: 300 },
    );
  });
});
