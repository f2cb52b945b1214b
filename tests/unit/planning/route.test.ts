import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findRoute } from '@/lib/planning';

/** Shortest summed block length between two blocks by Bellman–Ford relaxation, for comparison. */
function shortestLength(blocks: { id: string; lengthMm: number }[], links: { a: string; b: string }[], from: string, to: string): number {
  const dist = new Map(blocks.map((b) => [b.id, Infinity]));
  const length = new Map(blocks.map((b) => [b.id, b.lengthMm]));
  dist.set(from, length.get(from)!);
  for (let i = 0; i < blocks.length; i++) {
    for (const { a, b } of links) {
      for (const [x, y] of [[a, b], [b, a]] as const) {
        if (dist.get(x)! + length.get(y)! < dist.get(y)!) dist.set(y, dist.get(x)! + length.get(y)!);
      }
    }
  }
  return dist.get(to)!;
}

describe('findRoute', () => {
  const blocks = [
    { id: 'A', lengthMm: 1000 },
    { id: 'B', lengthMm: 5000 },
    { id: 'C', lengthMm: 1000 },
    { id: 'D', lengthMm: 1000 },
    { id: 'E', lengthMm: 1000 },
    { id: 'island', lengthMm: 1000 },
  ];
  const links = [
    { a: 'A', b: 'B' },
    { a: 'B', b: 'E' },
    { a: 'A', b: 'C' },
    { a: 'C', b: 'D' },
    { a: 'D', b: 'E' },
  ];

  it('takes the shorter way round, not the one with fewer blocks', () => {
    expect(findRoute({ blocks, links }, 'A', 'E')).toEqual(['A', 'C', 'D', 'E']);
    expect(findRoute({ blocks, links }, 'E', 'A')).toEqual(['E', 'D', 'C', 'A']);
  });

  it('handles the same block, unknown blocks and no connection', () => {
    expect(findRoute({ blocks, links }, 'C', 'C')).toEqual(['C']);
    expect(findRoute({ blocks, links }, 'A', 'nowhere')).toBeNull();
    expect(findRoute({ blocks, links }, 'A', 'island')).toBeNull();
  });

  it('finds a linked route of the shortest length on random track', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 1, maxLength: 8 }),
        fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 14 }),
        fc.nat(),
        fc.nat(),
        (lengths, pairs, f, t) => {
          const bs = lengths.map((l, i) => ({ id: `b${i}`, lengthMm: l * 100 }));
          const ls = pairs.map(([a, b]) => ({ a: bs[a % bs.length]!.id, b: bs[b % bs.length]!.id }));
          const from = bs[f % bs.length]!.id;
          const to = bs[t % bs.length]!.id;
          const route = findRoute({ blocks: bs, links: ls }, from, to);
          const best = shortestLength(bs, ls, from, to);
          if (best === Infinity) {
            expect(route).toBeNull();
            return;
          }
          expect(route).not.toBeNull();
          expect(route![0]).toBe(from);
          expect(route!.at(-1)).toBe(to);
          for (let i = 1; i < route!.length; i++) {
            const [a, b] = [route![i - 1], route![i]];
            expect(ls.some((l) => (l.a === a && l.b === b) || (l.a === b && l.b === a))).toBe(true);
          }
          const total = route!.reduce((sum, id) => sum + bs.find((b) => b.id === id)!.lengthMm, 0);
          expect(total).toBe(best);
        },
      ),
      { numRuns: 300 },
    );
  });
});
