import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countOverlapsInGroups, groupBy, orderByKey } from '@/lib/planning/intervals';

/** Keys that stress the bit layout: both zeros, subnormals, infinities, the powers of two, ties. */
const awkwardKey = fc.oneof(
  fc.double({ noNaN: true }),
  fc.constantFrom(0, -0, Number.MIN_VALUE, -Number.MIN_VALUE, Infinity, -Infinity, 1, -1, 2 ** 53, -(2 ** 60), 0.1, -0.1),
  fc.integer({ min: -3, max: 3 }).map((n) => n / 10),
);

describe('orderByKey (radix sort of indices by a number)', () => {
  // Oracle: Array.prototype.sort, stable since ECMA-262 10th edition (2019), with the comparator the
  // engine used before; ties keep the order the items were given in.
  it('orders 0..n−1 exactly as a stable comparator sort, ties by index', () => {
    fc.assert(
      fc.property(fc.array(awkwardKey, { maxLength: 300 }), (keys) => {
        const expected = keys.map((_, i) => i).sort((a, b) => keys[a]! - keys[b]! || a - b);
        expect(Array.from(orderByKey(keys))).toEqual(expected);
      }),
      { numRuns: 500 },
    );
  });

  it('orders given items by their keys, ties in the order given', () => {
    fc.assert(
      fc.property(
        fc.array(awkwardKey, { minLength: 1, maxLength: 200 }).chain((keys) =>
          fc.tuple(fc.constant(keys), fc.shuffledSubarray(keys.map((_, i) => i))),
        ),
        ([keys, items]) => {
          const expected = items
            .map((item, at) => ({ item, at }))
            .sort((x, y) => keys[x.item]! - keys[y.item]! || x.at - y.at)
            .map((x) => x.item);
          expect(Array.from(orderByKey(keys, items))).toEqual(expected);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('sorts a large array (the 16-bit passes, every one in use) like the comparator sort', () => {
    let state = 7;
    const next = () => ((state = (state * 48271) % 2147483647) / 2147483647 - 0.5) * 1e9;
    const awkward = [0, -0, Number.MIN_VALUE, -Number.MIN_VALUE, Infinity, -Infinity, 2 ** 53, -(2 ** 60), 0.1, -0.1];
    const keys = Array.from({ length: 40_000 }, (_, i) => (i % 7 === 0 ? awkward[i % awkward.length]! : next()));
    const expected = keys.map((_, i) => i).sort((a, b) => keys[a]! - keys[b]! || a - b);
    expect(Array.from(orderByKey(keys))).toEqual(expected);
  });
});

describe('groupBy and countOverlapsInGroups', () => {
  it('groups stably in the order given, leaving out negative groups', () => {
    const { items, offsets } = groupBy([1, 0, -1, 1, 0], 2, [4, 3, 2, 1, 0]);
    expect(Array.from(items)).toEqual([4, 1, 3, 0]);
    expect(Array.from(offsets)).toEqual([0, 2, 4]);
  });

  it('counts the overlapping pairs of each group as a brute force over all pairs does', () => {
    const interval = fc.record({ group: fc.integer({ min: -1, max: 3 }), start: fc.integer({ min: 0, max: 20 }), length: fc.integer({ min: 1, max: 8 }) });
    fc.assert(
      fc.property(fc.array(interval, { maxLength: 40 }), (list) => {
        const group = list.map((x) => x.group);
        const start = list.map((x) => x.start / 4);
        const end = list.map((x) => (x.start + x.length) / 4);
        const expected = [0, 0, 0, 0];
        for (let i = 0; i < list.length; i++) {
          for (let j = i + 1; j < list.length; j++) {
            if (group[i]! >= 0 && group[i] === group[j] && start[i]! < end[j]! && start[j]! < end[i]!) expected[group[i]!]!++;
          }
        }
        expect(countOverlapsInGroups(group, 4, start, end)).toEqual(expected);
      }),
      { numRuns: 400 },
    );
  });
});
