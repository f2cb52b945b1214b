/**
 * The interval helpers at their edges, on small hand-made inputs whose answers are worked out by hand
 * beside each check. Intervals are half-open, [start, end): two overlap exactly when
 * a.start < b.end && b.start < a.end, so intervals that only touch do not (common practice; the
 * half-open convention of Dijkstra, EWD831). The sweeps are the active-list sweep over intervals in
 * start order (worked by hand); nextUp is IEEE 754-2019 §5.3.1's, and the sums are rounded to
 * nearest, ties to even (IEEE 754-2019 §4.3.1, ECMA-262 §6.1.6.1 Number::add).
 */
import { describe, expect, it, vi } from 'vitest';
import {
  forEachMarkedOverlapInGroups,
  forEachOverlap,
  forEachOverlapInGroups,
  IntervalUnion,
  nextUp,
  orderByKey,
  shiftReaching,
} from '@/lib/planning/intervals';

/** The pairs a sweep visits, in the order it visits them. */
function visited(sweep: (visit: (earlier: number, later: number) => boolean) => void): [number, number][] {
  const pairs: [number, number][] = [];
  sweep((earlier, later) => {
    pairs.push([earlier, later]);
    return true;
  });
  return pairs;
}

describe('forEachOverlap: every overlapping pair once, touching intervals left out', () => {
  it('worked by hand: five intervals, two touching pairs, three overlapping ones', () => {
    // 0 [0,4)  1 [1,2)  2 [2,5)  3 [5,6)  4 [5.5,7), given in start order.
    // 1 ends at 2 where 2 starts, and 2 ends at 5 where 3 starts: touching, no overlap (half-open).
    // 0 ends at 4, before 3 and 4 start. Overlapping: 0–1 (1 < 4), 0–2 (2 < 4), 3–4 (5.5 < 6).
    const start = [0, 1, 2, 5, 5.5];
    const end = [4, 2, 5, 6, 7];
    const pairs = visited((visit) => forEachOverlap([0, 1, 2, 3, 4], start, end, (a, b) => void visit(a, b)));
    expect(pairs).toEqual([
      [0, 1],
      [0, 2],
      [3, 4],
    ]);
    // The definition itself, pair by pair, agrees (brute force over all pairs).
    const all: [number, number][] = [];
    for (let b = 0; b < 5; b++) for (let a = 0; a < b; a++) if (start[a]! < end[b]! && start[b]! < end[a]!) all.push([a, b]);
    expect([...pairs].sort((x, y) => x[1] - y[1] || x[0] - y[0])).toEqual(all);
  });

  it('visits nothing for no intervals, or for one', () => {
    expect(visited((visit) => forEachOverlap([], [], [], (a, b) => void visit(a, b)))).toEqual([]);
    expect(visited((visit) => forEachOverlap([0], [1], [2], (a, b) => void visit(a, b)))).toEqual([]);
  });
});

describe('forEachOverlapInGroups and forEachMarkedOverlapInGroups', () => {
  it('worked by hand: an interval ending where another starts is no longer active (half-open)', () => {
    // One group: 0 [0,2), 1 [2,3), 2 [1,3); start order 0, 2, 1. At 2's start (1) interval 0 is
    // active: 0–2. At 1's start (2) interval 0 has just ended (2 is not after 2) and 2 is active: 2–1.
    const start = [0, 2, 1];
    const end = [2, 3, 3];
    expect(visited((visit) => forEachOverlapInGroups([0, 2, 1], [0, 0, 0], 1, start, end, visit))).toEqual([
      [0, 2],
      [2, 1],
    ]);
    // The same three, all marked: the marked sweep finds the same pairs.
    expect(visited((visit) => forEachMarkedOverlapInGroups([0, 2, 1], [0, 0, 0], 1, [1, 1, 1], start, end, visit))).toEqual([
      [0, 2],
      [2, 1],
    ]);
  });

  it('leaves out intervals of a negative group, marked or not (as groupBy does)', () => {
    // 0 [0,2) and 1 [1,3) overlap (1 < 2), but both are in group −1; 2 [1,3) in group 0 has no partner.
    const start = [0, 1, 1];
    const end = [2, 3, 3];
    expect(visited((visit) => forEachMarkedOverlapInGroups([0, 1, 2], [-1, -1, 0], 1, [1, 1, 1], start, end, visit))).toEqual([]);
    expect(visited((visit) => forEachMarkedOverlapInGroups([0, 1, 2], [-1, -1, 0], 1, [1, 0, 0], start, end, visit))).toEqual([]);
    expect(visited((visit) => forEachOverlapInGroups([0, 1, 2], [-1, -1, 0], 1, start, end, visit))).toEqual([]);
  });
});

describe('nextUp: the next double above x (IEEE 754-2019 §5.3.1)', () => {
  it('steps one unit in the last place, up for positives and towards zero for negatives', () => {
    // ECMA-262 §21.1.2.1: Number.EPSILON is the gap between 1 and the next double above it, 2^−52.
    expect(nextUp(1)).toBe(1 + Number.EPSILON);
    // Below 1 (in [0.5, 1)) the doubles lie twice as close: 2^−53 apart.
    expect(nextUp(-1)).toBe(-1 + Number.EPSILON / 2);
    expect(nextUp(2)).toBe(2 + 2 * Number.EPSILON);
    expect(nextUp(-2)).toBe(-2 + Number.EPSILON);
  });

  it('at zero and the ends of the range', () => {
    // Above ±0 comes the least subnormal, 2^−1074 (Number.MIN_VALUE); above −MIN_VALUE comes −0.
    expect(nextUp(0)).toBe(Number.MIN_VALUE);
    expect(nextUp(-0)).toBe(Number.MIN_VALUE);
    expect(nextUp(-Number.MIN_VALUE)).toBe(-0);
    expect(nextUp(Number.MIN_VALUE)).toBe(2 * Number.MIN_VALUE);
    // IEEE 754-2019 §5.3.1: nextUp of the largest finite number is +∞.
    expect(nextUp(Number.MAX_VALUE)).toBe(Infinity);
  });
});

describe('shiftReaching: the least shift that reaches the target in floating point', () => {
  /** The double just below x (IEEE 754-2019 §5.3.1: nextDown(x) is −nextUp(−x)). */
  const nextDown = (x: number) => -nextUp(-x);

  it('worked by hand: 0.9 − 0.2 falls short, and one step of 2^−53 reaches it', () => {
    // 0.9 − 0.2 rounds to the double nearest 0.7, 0.69999999999999995559…, and 0.2 + that rounds to
    // 0.8999999999999999, below 0.9. The next double, 0.7 + 2^−53, gives 0.9000000000000001 ≥ 0.9.
    expect(0.2 + (0.9 - 0.2)).toBeLessThan(0.9);
    expect(shiftReaching(0.2, 0.9)).toBe(0.7 + 2 ** -53);
    expect(0.2 + shiftReaching(0.2, 0.9)).toBeGreaterThanOrEqual(0.9);
  });

  it('worked by hand: a negative shift, 0.1 − 0.5, steps towards zero', () => {
    // 0.1 − 0.5 is −0.4 (the double nearest), and 0.5 + −0.4 rounds to 0.09999999999999998 < 0.1;
    // the next double above −0.4 is −0.4 + 2^−54 = −0.39999999999999997, and 0.5 plus it reaches 0.1.
    expect(shiftReaching(0.5, 0.1)).toBe(-0.4 + 2 ** -54);
    expect(0.5 + shiftReaching(0.5, 0.1)).toBeGreaterThanOrEqual(0.1);
  });

  it('keeps an exact difference as it is, and an infinite one', () => {
    expect(shiftReaching(3, 7)).toBe(4);
    expect(shiftReaching(10, 10)).toBe(0);
    expect(shiftReaching(7, 3)).toBe(-4);
    expect(shiftReaching(-Number.MAX_VALUE, Number.MAX_VALUE)).toBe(Infinity);
  });

  it('over every pair of tenths from 0.1 to 10 s: reaches the target, and one double less would not', () => {
    // Brute-force oracle from the definition: d ≥ target − base, base + d ≥ target, and either
    // d is target − base itself or base + nextDown(d) falls short.
    let stepped = 0;
    const wrong: [number, number, number][] = [];
    for (let a = 1; a <= 100; a++) {
      for (let b = 1; b <= 100; b++) {
        const base = a / 10;
        const target = b / 10;
        const d = shiftReaching(base, target);
        const exact = d === target - base;
        if (!exact) stepped++;
        if (base + d < target || d < target - base || (!exact && base + nextDown(d) >= target)) wrong.push([base, target, d]);
      }
    }
    expect(wrong).toEqual([]);
    // Pairs such as (0.2, 0.9) above need the step: the oracle is not checking exact differences only.
    expect(stepped).toBeGreaterThan(0);
  });
});

describe('IntervalUnion: sorted, disjoint, merged where intervals touch or overlap', () => {
  it('merges an interval touching on either side into one (worked by hand)', () => {
    // [5,8) then [0,5): they touch at 5 and become [0,8), so a window inside the first part ends at 8.
    const left = new IntervalUnion();
    left.add(5, 8);
    left.add(0, 5);
    expect(left.overlapEnd(1, 2)).toBe(8);
    // [0,5) then [5,8): the same union, reached from the other side.
    const right = new IntervalUnion();
    right.add(0, 5);
    right.add(5, 8);
    expect(right.overlapEnd(1, 2)).toBe(8);
  });

  it('a window ending where an interval starts does not overlap it (half-open)', () => {
    // [0,5) and [10,20). The window [6,10) ends as [10,20) begins: no overlap. [3,10) meets [0,5) only.
    const union = new IntervalUnion();
    union.add(0, 5);
    union.add(10, 20);
    expect(union.overlapEnd(6, 10)).toBe(-Infinity);
    expect(union.overlapEnd(3, 10)).toBe(5);
    expect(union.overlapEnd(6, 10.5)).toBe(20);
    expect(union.overlapEnd(5, 6)).toBe(-Infinity);
  });

  it('an interval added between two others leaves the later one apart (worked by hand)', () => {
    // [0,1), [10,11), then [2,3): it touches neither, so there are three intervals and [5,6) is free.
    const union = new IntervalUnion();
    union.add(0, 1);
    union.add(10, 11);
    union.add(2, 3);
    expect(union.overlapEnd(5, 6)).toBe(-Infinity);
    expect(union.overlapEnd(2.5, 2.6)).toBe(3);
    expect(union.overlapEnd(10.2, 10.4)).toBe(11);
  });

  it('an interval bridging two keeps the earliest start and the latest end (worked by hand)', () => {
    // [0,2) and [4,6), then [1,5) overlaps both: one interval [0,6).
    const union = new IntervalUnion();
    union.add(0, 2);
    union.add(4, 6);
    union.add(1, 5);
    expect(union.overlapEnd(0.5, 1)).toBe(6);
    expect(union.overlapEnd(2.5, 3)).toBe(6);
  });

  it('merging in the middle keeps the intervals before and after (worked by hand)', () => {
    // [0,1), [3,4), [10,11), then [3.5,5) extends the middle one: [0,1), [3,5), [10,11).
    const union = new IntervalUnion();
    union.add(0, 1);
    union.add(3, 4);
    union.add(10, 11);
    union.add(3.5, 5);
    expect(union.overlapEnd(0.5, 0.6)).toBe(1);
    expect(union.overlapEnd(4.5, 4.6)).toBe(5);
    expect(union.overlapEnd(10.5, 10.6)).toBe(11);
    expect(union.overlapEnd(6, 9)).toBe(-Infinity);
  });
});

describe("orderByKey's byte-order probe", () => {
  it('a freshly loaded module reads the low word where this machine keeps it', async () => {
    // The probe runs once, at import; load the module again so that it runs here. 2 is
    // 0x40000000_00000000 and 1 + 2^−52 is 0x3FF00000_00000001 (IEEE 754 binary64): read with the
    // words swapped, 2's "high" word 0 would sort before 1 + 2^−52's 1.
    vi.resetModules();
    const fresh = await import('@/lib/planning/intervals');
    expect(Array.from(fresh.orderByKey([2, 1 + Number.EPSILON]))).toEqual([1, 0]);
    expect(Array.from(orderByKey([2, 1 + Number.EPSILON]))).toEqual([1, 0]);
  });
});
