/**
 * The route finder at its edges: what it refuses and how it says so, and which of several equally
 * long routes it takes. Model: Dijkstra's shortest paths (Cormen et al., Introduction to Algorithms,
 * 3rd ed., 24.3) over the states "in block i heading for end e", the order being length, then number
 * of blocks (a turn in a reversing place counts as one), then the smaller block id; the messages'
 * junction comes from a shortest path that ignores direction (the same algorithm over blocks). Every
 * expected route below is worked by hand on a few blocks; lengths are in mm.
 */
import { describe, expect, it } from 'vitest';
import { findRoute, ROUTE_WAYPOINTS_CAP, routeThrough, type TrackGraph } from '@/lib/planning';

type End = 'a' | 'b';
/** A joint from end `aEnd` of block `a` to end `bEnd` of block `b`. */
const joint = (a: string, aEnd: End, b: string, bEnd: End) => ({ a, aEnd, b, bEnd });
/** Blocks in the order given, with their lengths and anything more (a name, a reversing place). */
const blocksOf = (lengths: Record<string, number>, more: Record<string, { name?: string; reversingPlace?: boolean }> = {}) =>
  Object.entries(lengths).map(([id, lengthMm]) => ({ id, lengthMm, ...more[id] }));
/** A found route written 'S b→a', … : each block, the end it comes in by and the end it heads for. */
const routeOf = (...steps: string[]) => ({
  ok: true,
  steps: steps.map((step) => {
    const [blockId, ends] = step.split(' ');
    return { blockId, fromEnd: ends![0], toEnd: ends![2] };
  }),
});
const reasonOf = (track: TrackGraph, waypoints: string[]) => {
  const route = routeThrough(track, waypoints);
  return route.ok ? null : route.reason;
};
const HOW_TO_GO_ON = ': end the run where it must reverse and start another from there, or mark a block where trains may reverse';

describe('routeThrough: inputs it refuses', () => {
  const line: TrackGraph = {
    blocks: blocksOf({ A: 1000, B: 1000 }),
    links: [joint('A', 'b', 'B', 'a')],
  };

  it('needs at least one waypoint and takes at most ROUTE_WAYPOINTS_CAP (64)', () => {
    expect(routeThrough(line, [])).toEqual({ ok: false, reason: 'a route needs at least one block' });
    // 64 waypoints (all A: the train stays put) is the cap itself and still a route; 65 are refused.
    expect(ROUTE_WAYPOINTS_CAP).toBe(64);
    expect(routeThrough(line, Array(64).fill('A'))).toEqual(routeOf('A b→a'));
    expect(routeThrough(line, Array(65).fill('A'))).toEqual({ ok: false, reason: 'a route passes through at most 64 blocks given' });
  });

  it('names an unknown block', () => {
    expect(routeThrough(line, ['nowhere'])).toEqual({ ok: false, reason: 'unknown block "nowhere"' });
    expect(routeThrough(line, ['A', 'nowhere'])).toEqual({ ok: false, reason: 'unknown block "nowhere"' });
  });

  it('reads a block id listed twice as its first listing (worked by hand)', () => {
    // planSchema refuses duplicate ids; the route finder, given them anyway, keeps the first, as a
    // Map filled in order with "set if absent" does. The refusal names it by that block's name.
    const twice: TrackGraph = {
      blocks: [
        { id: 'X', lengthMm: 500, name: 'First X' },
        { id: 'X', lengthMm: 700, name: 'Second X' },
        { id: 'Y', lengthMm: 500 },
      ],
      links: [],
    };
    expect(reasonOf(twice, ['X', 'Y'])).toBe('no line joins First X to Y');
  });
});

describe('routeThrough: refusals name the blocks and the junction', () => {
  it('says no line joins two blocks in different pieces of track, by their names', () => {
    const apart: TrackGraph = {
      blocks: blocksOf({ A: 1000, B: 1000, C: 1000 }, { A: { name: 'Yard' }, C: { name: 'Island' } }),
      links: [joint('A', 'b', 'B', 'a')],
    };
    expect(reasonOf(apart, ['A', 'C'])).toBe('no line joins Yard to Island');
    expect(reasonOf(apart, ['C', 'B'])).toBe('no line joins Island to B');
  });

  it('names no junction when the reversal is at a waypoint that is a dead end (worked by hand)', () => {
    // A siding S leaves the main line at M1's b end, facing trains from A (as in route.test.ts),
    // M1 listed first. A → S arrives in S heading for its b end, where no line goes on: the way back
    // to A needs a reversal in S itself, a waypoint, not at a junction on the way.
    const junction: TrackGraph = {
      blocks: blocksOf({ M1: 1000, A: 1000, M2: 1000, S: 500 }, { M1: { name: 'Junction' }, S: { name: 'Siding' } }),
      links: [joint('A', 'b', 'M1', 'a'), joint('M1', 'b', 'M2', 'a'), joint('M1', 'b', 'S', 'a')],
    };
    expect(reasonOf(junction, ['A', 'S', 'A'])).toBe(`every way from Siding to A needs the train to reverse${HOW_TO_GO_ON}`);
  });

  it('names the first junction from where the train stands when the way turns twice (worked by hand)', () => {
    // F → P → J1 → M → J2 → G, the only line: P and M meet J1 at its b end, M and G meet J2 at its a
    // end, so the train turns in J1 and again in J2. The message names J1, the first one it meets.
    const twoTurns: TrackGraph = {
      blocks: blocksOf({ F: 1000, P: 1000, J1: 1000, M: 1000, J2: 1000, G: 1000 }),
      links: [joint('F', 'b', 'P', 'a'), joint('P', 'b', 'J1', 'b'), joint('J1', 'b', 'M', 'a'), joint('M', 'b', 'J2', 'a'), joint('J2', 'a', 'G', 'a')],
    };
    expect(reasonOf(twoTurns, ['F', 'G'])).toBe(`every way from F to G needs the train to reverse (at J1)${HOW_TO_GO_ON}`);
  });

  it('names the junction on the shortest way that ignores direction, the smaller id on a tie (Dijkstra, worked by hand)', () => {
    // F's b end meets J2, J1 and a spur X (listed in that order); G meets J1 at its b end and J2 at
    // its a end, so F → G turns in J1 or in J2. Ignoring direction, F–J1–G is 1200 mm and F–J2–G
    // 1600 mm (J1 100, J2 500, G 1000): the message names J1. With J2 as short as J1 both ways are
    // 1200 mm and the one through the smaller id, J1, is kept (it is settled first and a later way
    // must be strictly shorter to replace it).
    const parallel = (j2: number): TrackGraph => ({
      blocks: blocksOf({ F: 100, J1: 100, J2: j2, X: 100, G: 1000 }),
      links: [joint('F', 'b', 'J2', 'a'), joint('F', 'b', 'J1', 'b'), joint('F', 'b', 'X', 'a'), joint('J1', 'b', 'G', 'a'), joint('J2', 'a', 'G', 'a')],
    });
    expect(reasonOf(parallel(500), ['F', 'G'])).toBe(`every way from F to G needs the train to reverse (at J1)${HOW_TO_GO_ON}`);
    expect(reasonOf(parallel(100), ['F', 'G'])).toBe(`every way from F to G needs the train to reverse (at J1)${HOW_TO_GO_ON}`);
  });

  it('ignores a link from a block to itself, even one joining an end to itself (worked by hand)', () => {
    // M.b–M.b would be a balloon loop inside one block: route.ts ignores links from a block to itself
    // (as before blocks had ends). So after P → M the train heads for M's b end and cannot come back.
    const balloon: TrackGraph = {
      blocks: blocksOf({ P: 100, M: 100 }),
      links: [joint('P', 'b', 'M', 'a'), joint('M', 'b', 'M', 'b')],
    };
    expect(reasonOf(balloon, ['P', 'M', 'P'])).toBe(`every way from M to P needs the train to reverse${HOW_TO_GO_ON}`);
  });
});

describe('routeThrough: which of several routes it takes', () => {
  it('a one-block route keeps the first of its two equal directions, heading for a (worked by hand)', () => {
    // Both arrivals in A are A's length and one block; on a tie routeThrough keeps the first (a).
    const one: TrackGraph = { blocks: blocksOf({ A: 200 }), links: [] };
    expect(routeThrough(one, ['A'])).toEqual(routeOf('A b→a'));
  });

  it('arrives in the last block by whichever end the shorter route enters it (worked by hand)', () => {
    // S → P → T enters T at its a end (heading for b): 100 + P + 100 mm, 3 blocks. S → Q1 → Q2 → T
    // (100 each) enters T at its b end (heading for a): 400 mm, 4 blocks. P = 500: 700 mm, the
    // second is shorter. P = 200: both 400 mm, the first has fewer blocks. P = 100: 300 mm, shorter.
    const track = (p: number): TrackGraph => ({
      blocks: blocksOf({ S: 100, P: p, Q1: 100, Q2: 100, T: 100 }),
      links: [joint('S', 'b', 'P', 'a'), joint('P', 'b', 'T', 'a'), joint('S', 'a', 'Q1', 'a'), joint('Q1', 'b', 'Q2', 'a'), joint('Q2', 'b', 'T', 'b')],
    });
    expect(routeThrough(track(500), ['S', 'T'])).toEqual(routeOf('S b→a', 'Q1 a→b', 'Q2 a→b', 'T b→a'));
    const throughP = routeOf('S a→b', 'P a→b', 'T a→b');
    expect(routeThrough(track(200), ['S', 'T'])).toEqual(throughP);
    expect(routeThrough(track(100), ['S', 'T'])).toEqual(throughP);
  });

  it('keeps the shorter way into a long block even when a longer way has fewer blocks (worked by hand)', () => {
    // S–Y1–Y2–T is 1300 mm in 4 blocks, S–P–T 1600 mm in 3 (T 1000 long, P 500, the rest 100).
    // The first reaches T before P is even left, so the search looks at the second while T is open:
    // being one block fewer must not make it replace the shorter way.
    const track: TrackGraph = {
      blocks: blocksOf({ S: 100, Y1: 100, Y2: 100, P: 500, T: 1000 }),
      links: [
        { a: 'S', b: 'Y1' },
        { a: 'Y1', b: 'Y2' },
        { a: 'Y2', b: 'T' },
        { a: 'S', b: 'P' },
        { a: 'P', b: 'T' },
      ],
    };
    expect(findRoute(track, 'S', 'T')).toEqual(['S', 'Y1', 'Y2', 'T']);
  });

  it('among equally long routes takes the one with fewer blocks (worked by hand)', () => {
    // S–X–T and S–Y1–Y2–T are both 400 mm (X 200, the rest 100): the first has 3 blocks, the second
    // 4. With B1, B2 in place of Y1, Y2 the longer route also has the smaller ids: still S–X–T.
    for (const [one, two] of [
      ['Y1', 'Y2'],
      ['B1', 'B2'],
    ] as const) {
      const track: TrackGraph = {
        blocks: blocksOf({ S: 100, X: 200, [one]: 100, [two]: 100, T: 100 }),
        links: [
          { a: 'S', b: 'X' },
          { a: 'X', b: 'T' },
          { a: 'S', b: one },
          { a: one, b: two },
          { a: two, b: 'T' },
        ],
      };
      expect(findRoute(track, 'S', 'T')).toEqual(['S', 'X', 'T']);
    }
  });

  it('among equally long routes with as many blocks takes the one through the smaller block id (worked by hand)', () => {
    // S–K–T and S–L–T, K and L equally long: K < L, whichever link is listed first.
    const track = (first: string, second: string): TrackGraph => ({
      blocks: blocksOf({ S: 100, K: 100, L: 100, T: 100 }),
      links: [
        { a: 'S', b: first },
        { a: 'S', b: second },
        { a: first, b: 'T' },
        { a: second, b: 'T' },
      ],
    });
    expect(findRoute(track('K', 'L'), 'S', 'T')).toEqual(['S', 'K', 'T']);
    expect(findRoute(track('L', 'K'), 'S', 'T')).toEqual(['S', 'K', 'T']);
  });

  it('does not turn for nothing in a reversing place at the start (worked by hand)', () => {
    // A (a reversing place) – B: setting off towards B is one block fewer than turning in A first.
    const track: TrackGraph = {
      blocks: blocksOf({ A: 100, B: 300 }, { A: { reversingPlace: true } }),
      links: [joint('A', 'b', 'B', 'a')],
    };
    expect(routeThrough(track, ['A', 'B'])).toEqual(routeOf('A a→b', 'B a→b'));
  });

  it('goes round a loop of two blocks the way that needs no turn (worked by hand)', () => {
    // B and C are joined at both pairs of ends (B.a–C.b, B.b–C.a), a loop; A hangs off C's b end, and
    // C is a reversing place. B → C (in at a) → A is 800 mm in 3 blocks; B → C (in at b, turn) → A is
    // as long but the turn counts a fourth: the train goes through C without turning.
    const track: TrackGraph = {
      blocks: blocksOf({ A: 300, B: 300, C: 200 }, { A: { reversingPlace: true }, C: { reversingPlace: true } }),
      links: [joint('B', 'a', 'C', 'b'), joint('C', 'b', 'A', 'a'), joint('B', 'b', 'C', 'a')],
    };
    expect(routeThrough(track, ['B', 'A'])).toEqual(routeOf('B a→b', 'C a→b', 'A a→b'));
  });

  it('turns in a reversing place when that makes an equally long route one block shorter (worked by hand)', () => {
    // From S to G, 600 mm either way. Straight: S → A1 → A2 → A3 → A4 → R (in at b) → G: 7 blocks
    // (A1–A3 50, A4 150). With a turn in R: S → Z1 → Z2 → R (in at a, turn, out at a) → G: the
    // route is 5 blocks and the turn counts one more, 6. The turn wins.
    const track: TrackGraph = {
      blocks: blocksOf({ S: 100, A1: 50, A2: 50, A3: 50, A4: 150, Z1: 200, Z2: 100, R: 100, G: 100 }, { R: { reversingPlace: true } }),
      links: [
        joint('S', 'b', 'A1', 'a'),
        joint('A1', 'b', 'A2', 'a'),
        joint('A2', 'b', 'A3', 'a'),
        joint('A3', 'b', 'A4', 'a'),
        joint('A4', 'b', 'R', 'b'),
        joint('S', 'a', 'Z1', 'a'),
        joint('Z1', 'b', 'Z2', 'a'),
        joint('Z2', 'b', 'R', 'a'),
        joint('R', 'a', 'G', 'a'),
      ],
    };
    expect(routeThrough(track, ['S', 'G'])).toEqual(routeOf('S b→a', 'Z1 a→b', 'Z2 a→b', 'R a→a', 'G a→b'));
  });
});
