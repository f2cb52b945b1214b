/**
 * Edges of the engine's small modules (heap, motion, session clock, positions, plan index, names), each
 * with its answer worked out by hand: deterministic cases, so they do not wait on a property test to find them.
 */
import { describe, expect, it } from 'vitest';
import { clockActionRefusal, defaultRamps, indexPlan, Movement, readSessionClock, type ClockRecord, type Plan } from '@/lib/planning';
import { MinHeap } from '@/lib/planning/heap';
import { planNames, sentenceCase } from '@/lib/planning/names';
import { firstById } from '@/lib/planning/plan-index';
import { trainPositionsAt } from '@/lib/planning/positions';
import { basePlan } from './polarity-plan';

describe('MinHeap (the textbook binary heap, Cormen et al., Introduction to Algorithms, ch. 6)', () => {
  const drain = (values: number[]) => {
    const heap = new MinHeap<number>((a, b) => a < b);
    for (const v of values) heap.push(v);
    const out: number[] = [];
    while (heap.size > 0) out.push(heap.pop()!);
    return out;
  };

  it('pops in ascending order (heapsort, §6.4): each pop sifts the last item down from the root', () => {
    // 1, 2, 3 push to [1, 2, 3]; popping 1 puts 3 at the root over its left child 2: it must sift down.
    expect(drain([1, 2, 3])).toEqual([1, 2, 3]);
    // 1, 3, 2, 4 push to [1, 3, 2, 4]; popping 1 puts 4 at the root over 3 (left) and 2 (right): the
    // smaller child, the right one, comes up.
    expect(drain([1, 3, 2, 4])).toEqual([1, 2, 3, 4]);
    // Ten items make a heap four levels deep, so an item sifts down more than one level.
    expect(drain([5, 3, 8, 1, 9, 2, 7, 4, 6, 0])).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it('pops undefined from an empty heap, and its last item leaves it empty', () => {
    const heap = new MinHeap<number>((a, b) => a < b);
    expect(heap.pop()).toBeUndefined();
    heap.push(7);
    expect(heap.pop()).toBe(7);
    expect(heap.size).toBe(0);
  });
});

describe('defaultRamps: the rows by scale ratio (common practice, as its comment tables them)', () => {
  it('gives each row from its lower bound: 1:150, 1:70 and 1:40 belong to the row they start', () => {
    const rates = (ratio: number) => [defaultRamps(ratio).accelKmhPerS, defaultRamps(ratio).brakingKmhPerS];
    expect(rates(160)).toEqual([20, 25]); // N
    expect(rates(150)).toEqual([20, 25]);
    expect(rates(87)).toEqual([15, 20]); // H0
    expect(rates(70)).toEqual([15, 20]);
    expect(rates(64)).toEqual([12, 15]); // S
    expect(rates(40)).toEqual([12, 15]);
    expect(rates(32)).toEqual([10, 12]); // 1 (I)
  });

  it('says where its figures come from', () => {
    expect(defaultRamps(87).source).toMatch(/^common practice: /);
  });
});

describe('Movement.timeAt outside the movement', () => {
  // 1000 mm at cruise 100 mm/s, accelerating and braking at 50 mm/s² (elementary kinematics): 2 s and
  // 100 mm to reach the cruise, 2 s and 100 mm to stop, 800 mm cruising (8 s): 12 s in all.
  const movement = new Movement(1000, 100, 50, 50);

  it('reads 0 before the start and the whole duration past the end', () => {
    expect(movement.duration).toBeCloseTo(12, 9);
    expect(movement.timeAt(-10)).toBe(0);
    expect(movement.timeAt(0)).toBe(0);
    expect(movement.timeAt(1000)).toBe(movement.duration);
    expect(movement.timeAt(1010)).toBe(movement.duration);
  });
});

describe('readSessionClock and clockActionRefusal: actions at the edges', () => {
  // 6:1 from 06:00 (common practice for fast clocks); times in ms from an arbitrary T0.
  const clock = { ratio: 6, fastStart: '06:00' };
  const T0 = Date.UTC(2031, 3, 12, 18, 0, 0);
  const at = (realS: number) => T0 + realS * 1000;

  it('an action stamped at the very moment read is already in force', () => {
    const records: ClockRecord[] = [{ action: 'start', atMs: at(100), sessionS: 0 }];
    expect(readSessionClock(records, at(100), clock)).toEqual({ state: 'running', sessionS: 0, fastS: 6 * 3600 });
  });

  it('a pause or resume before any start changes nothing', () => {
    expect(readSessionClock([{ action: 'pause', atMs: at(10), sessionS: null }], at(20), clock).state).toBe('not-started');
    expect(readSessionClock([{ action: 'resume', atMs: at(10), sessionS: null }], at(20), clock)).toMatchObject({ state: 'not-started', sessionS: 0 });
  });

  it('a resume of a running clock does not set it back to where it was last anchored', () => {
    // Started at 0, a stray resume at 100 s: at 200 s it has run 200 s.
    const records: ClockRecord[] = [
      { action: 'start', atMs: at(0), sessionS: 0 },
      { action: 'resume', atMs: at(100), sessionS: null },
    ];
    expect(readSessionClock(records, at(200), clock).sessionS).toBe(200);
  });

  it('a running clock may be paused and a paused one resumed', () => {
    expect(clockActionRefusal('running', 'pause')).toBeNull();
    expect(clockActionRefusal('paused', 'resume')).toBeNull();
  });
});

describe('trainPositionsAt: the session end, empty runs and the run order (worked by hand)', () => {
  type Spec = [id: string, trainId: string, departS: number, steps: [string, number, number][]];
  const runs = (specs: Spec[]) =>
    specs.map(([id, trainId, departS, steps]) => ({ id, trainId, departS, steps: steps.map(([blockId, enterS, exitS]) => ({ blockId, enterS, exitS })) }));
  // Train A runs Yard→Main, 0–100 s; train B runs Yard→Station, 100–300 s. B's run is listed first.
  const line = runs([
    ['b1', 'B', 100, [['Yard', 100, 200], ['Station', 190, 300]]],
    ['a1', 'A', 0, [['Yard', 0, 60], ['Main', 50, 100]]],
  ]);
  const where = (list: ReturnType<typeof runs>, atS: number, endS?: number) =>
    Object.fromEntries(trainPositionsAt(list, atS, endS).map((p) => [p.trainId, `${p.state} ${p.blockIds.join('+')} ${p.runId}`]));

  it('without a session end, the session lasts until the latest exit of any step, in whatever order', () => {
    // At 250 s A stands in Main after a1 (until 300 s, B's last exit); B is on Station.
    expect(where(line, 250)).toEqual({ B: 'running Station b1', A: 'standing Main a1' });
    // At 300 s the session is over.
    expect(where(line, 300)).toEqual({});
  });

  it('a session end given is kept even when a step runs past it', () => {
    // Ends at 200 s: at 250 s A is no longer anywhere; B is still on its run.
    expect(where(line, 250, 200)).toEqual({ B: 'running Station b1' });
  });

  it('a run with no steps places nobody', () => {
    const withEmpty = [...line, ...runs([['e1', 'E', 0, []], ['a2', 'A', 500, []]])];
    expect(where(withEmpty, 250)).toEqual({ B: 'running Station b1', A: 'standing Main a1' });
  });

  it('takes a train’s runs by departure, then by id, whatever order they are listed in', () => {
    // Train T: t2 departs at 200 s from Shed, t1 at 100 s from Yard. Before both it stands where the
    // earlier departure starts: Yard (t1).
    const byDeparture = runs([
      ['t2', 'T', 200, [['Shed', 200, 250]]],
      ['t1', 'T', 100, [['Yard', 100, 150]]],
    ]);
    expect(where(byDeparture, 0)).toEqual({ T: 'standing Yard t1' });
    // Two runs departing at the same time: the lower id ('u1' < 'u2') is first, listed either way.
    const tied: Spec[] = [
      ['u2', 'U', 100, [['Shed', 100, 150]]],
      ['u1', 'U', 100, [['Yard', 120, 170]]],
    ];
    expect(where(runs(tied), 0)).toEqual({ U: 'standing Yard u1' });
    expect(where(runs([...tied].reverse()), 0)).toEqual({ U: 'standing Yard u1' });
  });
});

describe('indexPlan and firstById: references that do not resolve', () => {
  const step = { blockId: 'A', enterS: 0, exitS: 10 };
  const run = (id: string, trainId: string, cabId: string, operatorId: string | null): Plan['runs'][number] => ({
    id, trainId, cabId, operatorId, departS: 0, arriveS: 10, steps: [step],
  });
  const base = basePlan({});
  // Not a plan the schema accepts: the index must still give -1 ("none") for every reference it cannot resolve.
  const plan = basePlan({
    drivers: [...base.drivers, { ...base.drivers[0]!, id: 'd-lost', supplyId: 'no-supply' }],
    cabs: [...base.cabs, { id: 'c-lost', name: 'Cab 3', driverId: 'no-driver', channel: 1 }, { id: 'c4', name: 'Cab 4', driverId: 'd-lost', channel: 1 }],
    blocks: [{ id: 'A', name: 'A', lengthMm: 1000 }],
    operators: [{ id: 'o1', name: 'Ann' }],
    runs: [run('r1', 't', 'c1', 'o1'), run('r2', 'no-train', 'no-cab', 'no-operator'), run('r3', 'u', 'c-lost', null), run('r4', 'u', 'c4', null)],
  });

  it('gives -1 for an unknown train, cab, driver, supply or operator, and for whatever hangs off it', () => {
    const index = indexPlan(plan);
    expect([...index.driverSupply]).toEqual([0, -1]); // d → s; d-lost → no supply
    expect([...index.cabDriver]).toEqual([0, 0, -1, 1]); // c1, c2 → d; c-lost → none; c4 → d-lost
    expect([...index.runTrain]).toEqual([0, -1, 1, 1]);
    expect([...index.runCab]).toEqual([0, -1, 2, 3]);
    expect([...index.runDriver]).toEqual([0, -1, -1, 1]);
    expect([...index.runSupply]).toEqual([0, -1, -1, -1]);
    expect([...index.runOperator]).toEqual([0, -1, -1, -1]);
  });

  it('firstById keeps the first of a repeated id', () => {
    const map = firstById([{ id: 'x' }, { id: 'y' }, { id: 'x' }], (_, i) => i);
    expect([...map]).toEqual([['x', 0], ['y', 1]]);
  });
});

describe('planNames and sentenceCase', () => {
  it('trims names, falls back to the quoted id for a blank name or an unknown run', () => {
    const names = planNames(basePlan({ blocks: [{ id: 'b1', name: '  North  ', lengthMm: 1000 }, { id: 'b2', name: '   ', lengthMm: 1000 }] }));
    expect(names.block('b1')).toBe('North');
    expect(names.block('b2')).toBe('"b2"');
    expect(names.run('gone')).toBe('run "gone"');
  });

  it('leaves an empty message empty', () => {
    expect(sentenceCase('')).toBe('');
    expect(sentenceCase('cab North')).toBe('Cab North');
  });
});
