/**
 * lib/planning/track.ts at its edges, on small hand-made track with every answer worked by hand from
 * the rules in the module's own documentation: a block has ends a and b, node = 2 × block + (0 a,
 * 1 b); a train leaves a block by the end it heads for and enters the next by the end joined to it,
 * reverses in a block when only that block's other end reaches the next one, and keeps its direction
 * over consecutive steps in one block. The joint parity is the textbook two-colouring by breadth-first
 * search (a graph can be 2-coloured exactly when it has no odd cycle; CLRS 22.2), where a joint of like
 * ends wants opposite wiring (NEM 631 2.3: the right-hand rail is positive in the direction of travel).
 *
 * The module is imported again before each test (vi.resetModules): its small functions are module-level
 * values, built when it is evaluated, and a mutation test run switches a change on after a top-of-file
 * import.
 */
import { beforeEach, describe, expect, it, vi } from 'vitest';

type Track = typeof import('@/lib/planning/track');
type End = 'a' | 'b';
let T: Track;

beforeEach(async () => {
  vi.resetModules();
  T = await import('@/lib/planning/track');
});

const link = (a: string, aEnd: End, b: string, bEnd: End) => ({ a, aEnd, b, bEnd });
/** Block index by id, undefined for an id the track does not have. */
const indexIn = (ids: string[]) => (id: string) => (ids.includes(id) ? ids.indexOf(id) : undefined);

type StepSpec = string | { block: string; fromEnd?: End; toEnd?: End };
const stepsOf = (ids: string[], steps: StepSpec[]) =>
  steps.map((s) => (typeof s === 'string' ? { block: ids.indexOf(s) } : { ...s, block: ids.indexOf(s.block) }));
/** A run's travel, ends written as one letter per step: from 'ab' means step 0 enters at a, step 1 at b. */
const shown = (travel: { fromEnd: End[]; toEnd: End[]; joined: boolean[] }) => ({ from: travel.fromEnd.join(''), to: travel.toEnd.join(''), joined: travel.joined });
function travel(ids: string[], links: ReturnType<typeof link>[], steps: StepSpec[]) {
  return shown(T.travelOfRun(stepsOf(ids, steps), T.endAdjacency(ids.length, links, indexIn(ids))));
}

describe('ends, signs and node numbers', () => {
  it('worked by hand from the definitions: σ(b) = +1, σ(a) = −1; wiring +1 right (the default), −1 left; node = 2 × block + end', () => {
    expect([T.otherEnd('a'), T.otherEnd('b')]).toEqual(['b', 'a']);
    expect([T.endSign('b'), T.endSign('a')]).toEqual([1, -1]);
    // Direction of travel as a sign: +1 heading for b (NEM 631 2.3 then wants the forward output on right-wired track).
    expect([T.headingSign('b'), T.headingSign('a')]).toEqual([1, -1]);
    expect([T.wiringSign('right'), T.wiringSign('left'), T.wiringSign(undefined)]).toEqual([1, -1, 1]);
    expect([T.endNode(3, 'a'), T.endNode(3, 'b')]).toEqual([6, 7]);
    expect([T.nodeBlock(6), T.nodeBlock(7), T.nodeEnd(6), T.nodeEnd(7)]).toEqual([3, 3, 'a', 'b']);
    expect([T.endCode(undefined), T.endCode('a'), T.endCode('b')]).toEqual([-1, 0, 1]);
  });
});

describe('endAdjacency', () => {
  const ids = ['X', 'Y'];

  it('skips a link naming a block the track does not have, at either side (worked by hand)', () => {
    // Only X.b–Y.a counts: node 1 (X.b) lists node 2 (Y.a) and back.
    const joined = T.endAdjacency(2, [link('X', 'b', 'gone', 'a'), link('gone', 'b', 'Y', 'a'), link('X', 'b', 'Y', 'a')], indexIn(ids));
    expect(joined).toEqual([[], [2], [1], []]);
  });

  it('counts a link listed twice once, whichever way round it is written (worked by hand)', () => {
    const joined = T.endAdjacency(2, [link('X', 'b', 'Y', 'a'), link('X', 'b', 'Y', 'a'), link('Y', 'a', 'X', 'b')], indexIn(ids));
    expect(joined).toEqual([[], [2], [1], []]);
  });

  it('lists an end joined to itself once (planSchema does not refuse a link from a block to itself)', () => {
    expect(T.endAdjacency(2, [link('X', 'b', 'X', 'b')], indexIn(ids))).toEqual([[], [1], [], []]);
  });
});

describe('travelOfRun: the first step', () => {
  const ids = ['X', 'Y'];

  it('heads for b when both ends of the first block reach the next block (the rule in its doc)', () => {
    // X.a–Y.a and X.b–Y.b: X heads for b, so Y is entered at b (joined to X.b) and left by a.
    expect(travel(ids, [link('X', 'a', 'Y', 'a'), link('X', 'b', 'Y', 'b')], ['X', 'Y'])).toEqual({ from: 'ab', to: 'ba', joined: [false, true] });
  });

  it('heads for b when no end reaches the next block, and enters an unlinked block at a, over no joint', () => {
    expect(travel(ids, [], ['X', 'Y'])).toEqual({ from: 'aa', to: 'bb', joined: [false, false] });
  });

  it('heads away from a given fromEnd: entering at b it heads for a (worked by hand)', () => {
    expect(travel(ids, [], [{ block: 'X', fromEnd: 'b' }])).toEqual({ from: 'b', to: 'a', joined: [false] });
    // With X.a–Y.b, leaving X by a it enters Y at b, over the joint.
    expect(travel(ids, [link('X', 'a', 'Y', 'b')], [{ block: 'X', fromEnd: 'b' }, 'Y'])).toEqual({ from: 'bb', to: 'aa', joined: [false, true] });
  });

  it('keeps both given ends of a first step that turns in its block', () => {
    expect(travel(ids, [], [{ block: 'X', fromEnd: 'b', toEnd: 'b' }])).toEqual({ from: 'b', to: 'b', joined: [false] });
    expect(travel(ids, [], [{ block: 'X', fromEnd: 'a', toEnd: 'a' }])).toEqual({ from: 'a', to: 'a', joined: [false] });
  });

  it('a run staying in one block heads for b, even where a link joins that block’s a end to itself', () => {
    // The first step looks at the next *other* block; there is none, so b (the rule in its doc), and
    // the second step in the same block keeps the direction.
    expect(travel(ids, [link('X', 'a', 'X', 'a')], ['X', 'X'])).toEqual({ from: 'aa', to: 'bb', joined: [false, false] });
  });
});

describe('travelOfRun: steps after the first', () => {
  it('keeps given ends of a later step in the same block, and copies the direction where none are given', () => {
    const ids = ['X'];
    expect(travel(ids, [], [{ block: 'X', fromEnd: 'b', toEnd: 'b' }, { block: 'X', fromEnd: 'a', toEnd: 'a' }])).toEqual({ from: 'ba', to: 'ba', joined: [false, false] });
    expect(travel(ids, [], ['X', 'X'])).toEqual({ from: 'aa', to: 'bb', joined: [false, false] });
  });

  it('reverses in the block before when only its other end reaches this block (worked by hand)', () => {
    // X entered at a (given), so it would head for b; but only X.a joins Y (at Y.b): the train turns in X,
    // leaves by a and enters Y at b over the joint.
    expect(travel(['X', 'Y'], [link('X', 'a', 'Y', 'b')], [{ block: 'X', fromEnd: 'a' }, 'Y'])).toEqual({ from: 'ab', to: 'aa', joined: [false, true] });
  });

  it('takes a given fromEnd over the link, and then the step crosses no joint (worked by hand)', () => {
    // X.b–Y.b, but the step says Y is entered at a: no link joins X.b to Y.a.
    expect(travel(['X', 'Y'], [link('X', 'b', 'Y', 'b')], ['X', { block: 'Y', fromEnd: 'a' }])).toEqual({ from: 'aa', to: 'bb', joined: [false, false] });
  });

  it('says which steps are entered over a joint: the first never, an unlinked one not', () => {
    // X.b–Y.b only: Y is entered at b over the joint; Z is joined to nothing.
    expect(travel(['X', 'Y', 'Z'], [link('X', 'b', 'Y', 'b')], ['X', 'Y', 'Z'])).toEqual({ from: 'aba', to: 'bab', joined: [false, true, false] });
  });

  it('goes out and back through a turnout: the siding is entered by its linked end and the train turns there (worked by hand)', () => {
    // X.b is a turnout to Y.b and W.a. X → Y → X: into Y at b, Y's other end joins nothing, so the
    // train turns in Y (b to b) and comes back into X at b, heading for a.
    const ids = ['X', 'Y', 'W'];
    expect(travel(ids, [link('X', 'b', 'Y', 'b'), link('X', 'b', 'W', 'a')], ['X', 'Y', 'X'])).toEqual({ from: 'abb', to: 'bba', joined: [false, true, true] });
  });

  it('runs over blocks the adjacency does not list as over unlinked track', () => {
    expect(shown(T.travelOfRun(stepsOf(['X', 'Y'], ['X', 'Y']), []))).toEqual({ from: 'aa', to: 'bb', joined: [false, false] });
  });
});

describe('travelOfRun: a block both of whose ends join the end the train leaves by (a two-block loop)', () => {
  // The train goes on towards the next block: it enters by the end whose far end reaches the next
  // block. Worked by hand, step by step, in each test.
  const ids = ['X', 'Y', 'Z'];

  it('Y.a listed first, Z reached from Y.a: enters Y at b and leaves by a', () => {
    // X.b joins Y.a then Y.b; Y.a also joins Z.a. Y.b does not reach Z, Y.a does: in at b, out at a, into Z at a.
    const links = [link('X', 'b', 'Y', 'a'), link('X', 'b', 'Y', 'b'), link('Y', 'a', 'Z', 'a')];
    expect(travel(ids, links, ['X', 'Y', 'Z'])).toEqual({ from: 'aba', to: 'bab', joined: [false, true, true] });
  });

  it('Y.b listed first, Z reached from Y.b: enters Y at a and leaves by b', () => {
    const links = [link('X', 'b', 'Y', 'b'), link('X', 'b', 'Y', 'a'), link('Y', 'b', 'Z', 'a')];
    expect(travel(ids, links, ['X', 'Y', 'Z'])).toEqual({ from: 'aaa', to: 'bbb', joined: [false, true, true] });
  });

  it('Y.b listed first, Z reached from both ends of Y: the first listed end (b) is taken', () => {
    // In at b (the first listed), out at a into Z.a.
    const links = [link('X', 'b', 'Y', 'b'), link('X', 'b', 'Y', 'a'), link('Y', 'a', 'Z', 'a'), link('Y', 'b', 'Z', 'b')];
    expect(travel(ids, links, ['X', 'Y', 'Z'])).toEqual({ from: 'aba', to: 'bab', joined: [false, true, true] });
  });

  it('with the next step in the same block, the first listed end is taken', () => {
    // X.b joins Y.a then Y.b (and Y.a joins itself, which planSchema does not refuse): in at a, twice.
    const links = [link('X', 'b', 'Y', 'a'), link('X', 'b', 'Y', 'b'), link('Y', 'a', 'Y', 'a')];
    expect(travel(ids, links, ['X', 'Y', 'Y'])).toEqual({ from: 'aaa', to: 'bbb', joined: [false, true, false] });
  });
});

describe('travelOfRun on a hand-made adjacency that names an end more than once', () => {
  // Nodes: X.a 0, X.b 1, Y.a 2, Y.b 3, Z.a 4, Z.b 5. An end named twice is still that one end.
  it('Y.b named twice at X.b: only Y.b joins, so the train enters at b and turns in Y to reach Z', () => {
    // Y.b also joins Z.a; Y.a joins nothing. In at b; the only way on is back out by b: a turn in Y.
    const joined = [[], [3, 3], [], [1, 1, 4], [3], []];
    expect(shown(T.travelOfRun(stepsOf(['X', 'Y', 'Z'], ['X', 'Y', 'Z']), joined))).toEqual({ from: 'aba', to: 'bbb', joined: [false, true, true] });
  });

  it('Y.a, Y.b, Y.a named at X.b: a first, so the train enters Y at a', () => {
    const joined = [[], [2, 3, 2], [1], [1]];
    expect(shown(T.travelOfRun(stepsOf(['X', 'Y'], ['X', 'Y']), joined))).toEqual({ from: 'aa', to: 'bb', joined: [false, true] });
  });
});

describe('travelOfSteps: flat steps, flat answers', () => {
  // Track X.a–Y.b: nodes X.a 0 and Y.b 3 joined.
  const joined = [[3], [], [], [0]];
  const flat = (givenFrom: number[], givenTo: number[]) => ({ block: [0, 1], givenFrom, givenTo });
  const untouched = () => ({ fromEnd: new Uint8Array(2).fill(9), toEnd: new Uint8Array(2).fill(9), joined: new Uint8Array(2).fill(9) });

  it('works out only steps first .. end − 1 and writes only there; the steps after are another run', () => {
    // Steps 0..0 of [X, Y]: a one-step run in X heads for b (entered at a), whatever step 1 is.
    const out = untouched();
    T.travelOfSteps(flat([-1, -1], [-1, -1]), 0, 1, joined, out);
    expect([...out.fromEnd, ...out.toEnd, ...out.joined]).toEqual([0, 9, 1, 9, 0, 9]);
  });

  it('writes ends as endCode numbers, 0 for a and 1 for b', () => {
    // Both steps: only X.a reaches Y, so X is run from b to a and Y entered at b over the joint.
    const out = untouched();
    T.travelOfSteps(flat([-1, -1], [-1, -1]), 0, 2, joined, out);
    expect([...out.fromEnd, ...out.toEnd, ...out.joined]).toEqual([1, 1, 0, 0, 0, 1]);
    // X entered at b (given), heading a; a one-step run.
    T.travelOfSteps(flat([1, -1], [-1, -1]), 0, 1, joined, out);
    expect([out.fromEnd[0], out.toEnd[0]]).toEqual([1, 0]);
  });
});

describe('checkJointParity', () => {
  const blocks = (n: number) => Array.from({ length: n }, () => ({ positiveRail: 'right' as const }));
  const numbered = (id: string) => (/^\d+$/.test(id) ? Number(id) : undefined);

  it('skips a link naming a block the track does not have, at either side', () => {
    // 0.a–1.a joins like ends, so wants opposite wiring (NEM 631 2.3 via the rule in track.ts); both are right-wired.
    const parity = T.checkJointParity(blocks(2), [link('0', 'b', 'gone', 'a'), link('gone', 'b', '1', 'a'), link('0', 'a', '1', 'a')], numbered);
    expect(parity).toEqual({ reversingLoops: [], mismatched: [2] });
  });

  it('lists a reversing loop’s blocks in order round the loop (worked by hand)', () => {
    // Ring 0 → 1 → 2 → 3 whose last joint meets 0's b end (3.b–0.b, like ends): one odd loop.
    // Breadth-first from 0: 1 and 3 at depth 1, 2 at depth 2 (from 1). Joint 2.b–3.a is met from 3
    // and closes the loop: 3 up to 0, then down 1, 2.
    const links = [link('0', 'b', '1', 'a'), link('1', 'b', '2', 'a'), link('2', 'b', '3', 'a'), link('3', 'b', '0', 'b')];
    expect(T.checkJointParity(blocks(4), links, numbered)).toEqual({ reversingLoops: [{ link: 2, blocks: [3, 0, 1, 2] }], mismatched: [] });
  });

  it('names at most 24 blocks of a longer loop (LOOP_NAMES_CAP), the first 24 round it (worked by hand)', () => {
    // Ring of 25: i.b–(i+1).a, and 24.b–0.b (like ends). Breadth-first from 0 the two ways round meet
    // at joint 12.b–13.a (both at depth 12): the loop is 12 … 1, 0, 24 … 13, and 13 is past the cap.
    const links = Array.from({ length: 24 }, (_, i) => link(String(i), 'b', String(i + 1), 'a'));
    links.push(link('24', 'b', '0', 'b'));
    const expected = [12, 11, 10, 9, 8, 7, 6, 5, 4, 3, 2, 1, 0, 24, 23, 22, 21, 20, 19, 18, 17, 16, 15, 14];
    expect(T.checkJointParity(blocks(25), links, numbered)).toEqual({ reversingLoops: [{ link: 12, blocks: expected }], mismatched: [] });
  });
});
