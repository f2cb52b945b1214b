import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findRoute, routeThrough } from '@/lib/planning';

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

  it('finds a route a train can take without reversing, of the shortest length, on random track with ends (brute-force oracle)', () => {
    // Oracle: Bellman–Ford over the states "in block i heading for end e", with the same moves the
    // route finder may make: over a joint into the joined block, heading for its far end; turning
    // round only in a reversing place. Independent of the Dijkstra in lib/planning/route.ts.
    const end = fc.constantFrom<'a' | 'b'>('a', 'b');
    fc.assert(
      fc.property(
        fc.array(fc.record({ length: fc.integer({ min: 1, max: 9 }), turn: fc.boolean() }), { minLength: 1, maxLength: 7 }),
        fc.array(fc.tuple(fc.nat(), fc.nat(), end, end), { maxLength: 12 }),
        fc.nat(),
        fc.nat(),
        (raw, pairs, f, t) => {
          const bs = raw.map((b, i) => ({ id: `b${i}`, lengthMm: b.length * 100, reversingPlace: b.turn && i % 3 === 0 }));
          const ls = pairs.map(([a, b, aEnd, bEnd]) => ({ a: bs[a % bs.length]!.id, b: bs[b % bs.length]!.id, aEnd, bEnd }));
          const from = bs[f % bs.length]!.id;
          const to = bs[t % bs.length]!.id;
          const other = (e: 'a' | 'b') => (e === 'a' ? 'b' : 'a');
          const key = (id: string, heading: 'a' | 'b') => `${id}:${heading}`;
          const dist = new Map<string, number>();
          for (const b of bs) for (const h of ['a', 'b'] as const) dist.set(key(b.id, h), Infinity);
          const len = (id: string) => bs.find((b) => b.id === id)!.lengthMm;
          dist.set(key(from, 'a'), len(from));
          dist.set(key(from, 'b'), len(from));
          for (let round = 0; round < 4 * bs.length + 2; round++) {
            for (const b of bs) {
              for (const h of ['a', 'b'] as const) {
                const here = dist.get(key(b.id, h))!;
                if (here === Infinity) continue;
                if (b.reversingPlace && here < dist.get(key(b.id, other(h)))!) dist.set(key(b.id, other(h)), here);
                for (const l of ls) {
                  for (const [x, xe, y, ye] of [[l.a, l.aEnd, l.b, l.bEnd], [l.b, l.bEnd, l.a, l.aEnd]] as const) {
                    // A link from a block to itself leads nowhere new: routes ignore it.
                    if (x !== b.id || xe !== h || x === y) continue;
                    const there = key(y, other(ye));
                    if (here + len(y) < dist.get(there)!) dist.set(there, here + len(y));
                  }
                }
              }
            }
          }
          const best = from === to ? len(from) : Math.min(dist.get(key(to, 'a'))!, dist.get(key(to, 'b'))!);
          const route = routeThrough({ blocks: bs, links: ls }, [from, to]);
          if (best === Infinity) {
            expect(route.ok).toBe(false);
            expect(findRoute({ blocks: bs, links: ls }, from, to)).toBeNull();
            return;
          }
          expect(route.ok).toBe(true);
          if (!route.ok) return;
          const steps = route.steps;
          expect(steps[0]!.blockId).toBe(from);
          expect(steps.at(-1)!.blockId).toBe(to);
          for (let i = 1; i < steps.length; i++) {
            const [x, y] = [steps[i - 1]!, steps[i]!];
            // Each move crosses a real joint: the end headed for in one block to the end entered in the next.
            expect(
              ls.some(
                (l) =>
                  (l.a === x.blockId && l.aEnd === x.toEnd && l.b === y.blockId && l.bEnd === y.fromEnd) ||
                  (l.b === x.blockId && l.bEnd === x.toEnd && l.a === y.blockId && l.aEnd === y.fromEnd),
              ),
            ).toBe(true);
          }
          // A turn (in and out by one end) only in a reversing place.
          for (const step of steps) if (step.fromEnd === step.toEnd) expect(bs.find((b) => b.id === step.blockId)!.reversingPlace).toBe(true);
          const total = steps.reduce((sum, s) => sum + len(s.blockId), 0);
          expect(total).toBe(best);
        },
      ),
      { numRuns: 400 },
    );
  });

  // A siding S leaves the main line at M1's b end, facing trains that come from A (common practice:
  // a facing and a trailing turnout). From M2 a train reaches S only by reversing in M1.
  const junction = {
    blocks: [
      { id: 'A', lengthMm: 1000 },
      { id: 'M1', lengthMm: 1000, name: 'Junction' },
      { id: 'M2', lengthMm: 1000 },
      { id: 'S', lengthMm: 500, name: 'Siding' },
    ],
    links: [
      { a: 'A', aEnd: 'b' as const, b: 'M1', bEnd: 'a' as const },
      { a: 'M1', aEnd: 'b' as const, b: 'M2', bEnd: 'a' as const },
      { a: 'M1', aEnd: 'b' as const, b: 'S', bEnd: 'a' as const },
    ],
  };

  it('refuses a route through a junction that needs a reversal, and names the junction', () => {
    const refused = routeThrough(junction, ['M2', 'S']);
    expect(refused.ok).toBe(false);
    if (!refused.ok) expect(refused.reason).toMatch(/every way from M2 to Siding needs the train to reverse \(at Junction\)/);
    expect(findRoute(junction, 'M2', 'S')).toBeNull();
    // The same siding is reached from A without a reversal, through the junction's facing turnout.
    expect(findRoute(junction, 'A', 'S')).toEqual(['A', 'M1', 'S']);
  });

  it('reverses in a block marked as a reversing place, and at the route\'s ends', () => {
    const marked = { ...junction, blocks: junction.blocks.map((b) => (b.id === 'M1' ? { ...b, reversingPlace: true } : b)) };
    const route = routeThrough(marked, ['M2', 'S']);
    expect(route).toEqual({
      ok: true,
      steps: [
        { blockId: 'M2', fromEnd: 'b', toEnd: 'a' },
        { blockId: 'M1', fromEnd: 'b', toEnd: 'b' },
        { blockId: 'S', fromEnd: 'a', toEnd: 'b' },
      ],
    });
    // A waypoint is not a reversal: M2 → S → M2 needs none (S is a dead end, so the train must turn there).
    expect(routeThrough(junction, ['A', 'S', 'A']).ok).toBe(false);
    // Two runs do it: the end of one and the start of the next may face either way.
    expect(findRoute(junction, 'S', 'A')).toEqual(['S', 'M1', 'A']);
  });
});
