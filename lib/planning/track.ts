import type { BlockEnd } from './schema';

/**
 * Track with ends. Every block has two ends, `a` and `b`; a link (a rail joint) joins an end of one
 * block to an end of another, and several links at one end make a turnout. A train goes through a
 * block from one end to the other; it can change direction only where the planner allows it.
 *
 * Polarity (NEM 631 2.3: with DC two-rail, the right-hand rail looking in the direction of travel is
 * positive). A block's wiring says which rail the cab's positive output feeds looking towards its
 * `b` end (`positiveRail`, right when absent). Travelling towards `b`, the right-hand rail is that
 * rail; towards `a`, the other one. So the cab output a train needs in a block is
 *   sign = direction × wiring,   direction = +1 towards `b`, −1 towards `a`;  wiring = +1 right, −1 left,
 * and +1 is the cab's forward output.
 *
 * At a joint between end eX of X and end eY of Y, the rail on the right of a train going from X
 * into Y continues from X's rail "right facing b" when eX = b (else its other rail) into Y's rail
 * "right facing b" when eY = a (else its other rail). With one cab output on both sides, the rails
 * across the gap agree exactly when
 *   wiring(X) × σ(eX) + wiring(Y) × σ(eY) = 0,   σ(b) = +1, σ(a) = −1.
 * A joint of two different ends (b to a) wants equal wiring, a joint of two like ends (a to a, b to
 * b) opposite wiring. A loop of joints wanting an odd number of "opposite" cannot be wired without
 * a mismatch somewhere: that is a reversing loop or wye, and one of its blocks needs a polarity
 * switch (a reversing section).
 */

export type End = BlockEnd;

export const otherEnd = (end: End): End => (end === 'a' ? 'b' : 'a');

/** +1 for the `b` end, −1 for the `a` end (σ above). */
export const endSign = (end: End): 1 | -1 => (end === 'b' ? 1 : -1);

/** Direction of travel as a sign: +1 heading for the `b` end. */
export const headingSign = (toEnd: End): 1 | -1 => endSign(toEnd);

/** +1 when the cab's positive output feeds the right-hand rail looking towards `b`, −1 for the left. */
export const wiringSign = (positiveRail: 'right' | 'left' | undefined): 1 | -1 => (positiveRail === 'left' ? -1 : 1);

/** The cab output a train needs heading for `toEnd` in a block so wired: +1 forward, −1 reverse (NEM 631 2.3). */
export function neededOutput(toEnd: End, positiveRail: 'right' | 'left' | undefined): 1 | -1 {
  return (headingSign(toEnd) * wiringSign(positiveRail)) as 1 | -1;
}

/** Whether the rails across a joint agree when both blocks get the same cab output (see above). */
export function jointAgrees(
  x: { end: End; positiveRail?: 'right' | 'left' | undefined },
  y: { end: End; positiveRail?: 'right' | 'left' | undefined },
): boolean {
  return wiringSign(x.positiveRail) * endSign(x.end) + wiringSign(y.positiveRail) * endSign(y.end) === 0;
}

/** A link's ends, with the defaults of plans written before blocks had ends (a's b end to b's a end). */
export function linkEnds(link: { aEnd?: End | undefined; bEnd?: End | undefined }): { aEnd: End; bEnd: End } {
  return { aEnd: link.aEnd ?? 'b', bEnd: link.bEnd ?? 'a' };
}

/** Node number of a block end: 2 × block + (0 for `a`, 1 for `b`). */
export const endNode = (block: number, end: End): number => 2 * block + (end === 'b' ? 1 : 0);
export const nodeBlock = (node: number): number => node >> 1;
export const nodeEnd = (node: number): End => ((node & 1) === 1 ? 'b' : 'a');

/**
 * For every block end, the block ends joined to it: `joined[endNode(i, e)]` lists nodes. Links to
 * unknown blocks are skipped; a link listed twice counts once.
 */
export function endAdjacency(
  blockCount: number,
  links: readonly { a: string; b: string; aEnd?: End | undefined; bEnd?: End | undefined }[],
  blockOf: (id: string) => number | undefined,
): number[][] {
  const joined: number[][] = Array.from({ length: 2 * blockCount }, () => []);
  const seen = new Set<number>();
  for (const link of links) {
    const a = blockOf(link.a);
    const b = blockOf(link.b);
    if (a === undefined || b === undefined) continue;
    const { aEnd, bEnd } = linkEnds(link);
    const x = endNode(a, aEnd);
    const y = endNode(b, bEnd);
    const key = Math.min(x, y) * 2 * blockCount + Math.max(x, y);
    if (seen.has(key)) continue;
    seen.add(key);
    joined[x]!.push(y);
    if (x !== y) joined[y]!.push(x);
  }
  return joined;
}

/** How a run goes through its blocks: per step, where it comes in and which end it heads for. */
export interface Travel {
  fromEnd: End[];
  toEnd: End[];
  /** Step k is entered over a joint that exists (false: no link, or the run's first step). */
  joined: boolean[];
}

/**
 * The direction of travel through each step of a run, from the steps' own `fromEnd`/`toEnd` where
 * given and otherwise from the links: a train leaves a block by the end it heads for and enters the
 * next by the end joined to it; when no link leaves by that end but one leaves by the other, the
 * train reversed in the block (fromEnd = toEnd there). Consecutive steps in one block keep the
 * direction. The first step heads for an end joined to the next block (the `b` end when both are,
 * or when the run has one block).
 */
export function travelOfRun(
  steps: readonly { block: number; fromEnd?: End | undefined; toEnd?: End | undefined }[],
  joined: readonly number[][],
): Travel {
  const n = steps.length;
  const flat = {
    block: Int32Array.from(steps, (step) => step.block),
    givenFrom: Int8Array.from(steps, (step) => endCode(step.fromEnd)),
    givenTo: Int8Array.from(steps, (step) => endCode(step.toEnd)),
  };
  const out = { fromEnd: new Uint8Array(n), toEnd: new Uint8Array(n), joined: new Uint8Array(n) };
  travelOfSteps(flat, 0, n, joined, out);
  return {
    fromEnd: Array.from(out.fromEnd, nodeEnd),
    toEnd: Array.from(out.toEnd, nodeEnd),
    joined: Array.from(out.joined, (j) => j === 1),
  };
}

/** An end as a number, as endNode numbers it (0 `a`, 1 `b`), or −1 when not given. */
export const endCode = (end: End | undefined): number => (end === undefined ? -1 : end === 'b' ? 1 : 0);

/** Steps laid out flat: block numbers, and their given ends as endCode gives them. */
export interface FlatSteps {
  block: ArrayLike<number>;
  givenFrom: ArrayLike<number>;
  givenTo: ArrayLike<number>;
}

/** travelOfRun's result laid out flat: ends as endCode numbers, joined as 1 or 0. */
export interface FlatTravel {
  fromEnd: Uint8Array;
  toEnd: Uint8Array;
  joined: Uint8Array;
}

/**
 * The ends of block `next` joined to end `end` (0 `a`, 1 `b`) of `block`, in the order the links
 * list them: 0 none, 1 only `a`, 2 only `b`, 3 `a` then `b`, 4 `b` then `a`.
 */
function joinedEnds(joined: readonly number[][], block: number, end: number, next: number): number {
  if (block < 0 || next < 0) return 0;
  const nodes = joined[2 * block + end];
  if (nodes === undefined) return 0;
  let code = 0;
  for (const node of nodes) {
    if (node >> 1 !== next) continue;
    const e = node & 1;
    if (code === 0) code = e + 1;
    else if (code <= 2 && code !== e + 1) code = code === 1 ? 3 : 4;
  }
  return code;
}
const firstJoined = (code: number): number => (code === 1 || code === 3 ? 0 : 1);
const secondJoined = (code: number): number => (code === 3 ? 1 : code === 4 ? 0 : -1);
const joinsEnd = (code: number, end: number): boolean => (code >= 3 ? true : code === end + 1);

/**
 * travelOfRun over the steps `first` .. `end − 1` of `steps`, written into `out` at the same
 * positions, so that a whole plan's travel is worked out with no objects per step.
 */
export function travelOfSteps(steps: FlatSteps, first: number, end: number, joined: readonly number[][], out: FlatTravel): void {
  const { block, givenFrom, givenTo } = steps;
  const { fromEnd, toEnd } = out;
  const reaches = (b: number, e: number, next: number) => joinedEnds(joined, b, e, next) !== 0;
  for (let k = first; k < end; k++) {
    const here = block[k]!;
    const next = k + 1 < end ? block[k + 1]! : null;
    const from = givenFrom[k]!;
    const to = givenTo[k]!;
    out.joined[k] = 0;
    if (k === first) {
      let heading = to >= 0 ? to : from >= 0 ? 1 - from : 1;
      if (to < 0 && from < 0 && next !== null && next !== here) {
        if (!reaches(here, 1, next) && reaches(here, 0, next)) heading = 0;
      }
      toEnd[k] = heading;
      fromEnd[k] = from >= 0 ? from : 1 - heading;
      continue;
    }
    const before = block[k - 1]!;
    if (before === here) {
      fromEnd[k] = from >= 0 ? from : fromEnd[k - 1]!;
      toEnd[k] = to >= 0 ? to : toEnd[k - 1]!;
      continue;
    }
    let leaving = toEnd[k - 1]!;
    // Implicit ends: reversal in the block before when only its other end reaches this block.
    if (givenTo[k - 1]! < 0 && !reaches(before, leaving, here) && reaches(before, 1 - leaving, here)) {
      leaving = 1 - leaving;
      toEnd[k - 1] = leaving;
    }
    const candidates = joinedEnds(joined, before, leaving, here);
    let entering: number;
    if (from >= 0) entering = from;
    else if (candidates === 0) entering = 0;
    else if (candidates <= 2 || next === null || next === here) entering = firstJoined(candidates);
    else {
      // Both ends of this block join the end left (a two-block loop): go on towards the next block.
      const one = firstJoined(candidates);
      const two = secondJoined(candidates);
      entering = reaches(here, 1 - one, next) ? one : reaches(here, 1 - two, next) ? two : one;
    }
    out.joined[k] = joinsEnd(candidates, entering) ? 1 : 0;
    fromEnd[k] = entering;
    toEnd[k] = to >= 0 ? to : 1 - entering;
  }
}

/** What findReversingLoops needs of a block. */
export interface WiredBlock {
  positiveRail?: 'right' | 'left' | undefined;
  reversingSection?: boolean | undefined;
}

export interface JointParity {
  /** Links (by index) that close a loop of joints that cannot all be wired to agree, with the loop's blocks. */
  reversingLoops: { link: number; blocks: number[] }[];
  /** Links between two ordinary blocks whose wiring disagrees, outside any reversing loop. */
  mismatched: number[];
}

/** Longest loop listed by name in a finding. */
const LOOP_NAMES_CAP = 24;

/**
 * The 2-colouring of the joints: over the links between ordinary blocks (a reversing section's
 * joints are switched, so they constrain nothing), a breadth-first search gives each block a wiring
 * relative to its component's first block; a link whose wanted relation contradicts the colouring
 * closes an odd loop (a reversing loop or wye). Components with no odd loop have wiring that can
 * agree everywhere; a joint there whose actual wiring disagrees is `mismatched`. O(blocks + links).
 */
export function checkJointParity(
  blocks: readonly WiredBlock[],
  links: readonly { a: string; b: string; aEnd?: End | undefined; bEnd?: End | undefined }[],
  blockOf: (id: string) => number | undefined,
): JointParity {
  const n = blocks.length;
  type Edge = { to: number; flip: number; link: number };
  const edges: Edge[][] = Array.from({ length: n }, () => []);
  const resolved: { a: number; b: number; aEnd: End; bEnd: End }[] = [];
  links.forEach((link, i) => {
    const a = blockOf(link.a);
    const b = blockOf(link.b);
    if (a === undefined || b === undefined) return;
    const { aEnd, bEnd } = linkEnds(link);
    resolved[i] = { a, b, aEnd, bEnd };
    if (blocks[a]!.reversingSection || blocks[b]!.reversingSection) return;
    // wiring(a) = −σ(aEnd)σ(bEnd) × wiring(b): flip 1 when the ends are alike.
    const flip = aEnd === bEnd ? 1 : 0;
    edges[a]!.push({ to: b, flip, link: i });
    if (a !== b) edges[b]!.push({ to: a, flip, link: i });
  });
  const colour = new Int8Array(n).fill(-1);
  const parent = new Int32Array(n).fill(-1);
  const depth = new Int32Array(n);
  const component = new Int32Array(n).fill(-1);
  const oddComponents = new Set<number>();
  const reversingLoops: JointParity['reversingLoops'] = [];
  const seenLink = new Set<number>();
  for (let root = 0; root < n; root++) {
    if (colour[root] !== -1) continue;
    colour[root] = 0;
    component[root] = root;
    const queue = [root];
    for (let q = 0; q < queue.length; q++) {
      const u = queue[q]!;
      for (const edge of edges[u]!) {
        const v = edge.to;
        const want = colour[u]! ^ edge.flip;
        if (colour[v] === -1) {
          colour[v] = want;
          parent[v] = u;
          depth[v] = depth[u]! + 1;
          component[v] = root;
          queue.push(v);
        } else if (colour[v] !== want && !seenLink.has(edge.link)) {
          seenLink.add(edge.link);
          oddComponents.add(root);
          reversingLoops.push({ link: edge.link, blocks: loopThrough(u, v, parent, depth) });
        }
      }
    }
  }
  const mismatched: number[] = [];
  resolved.forEach((link, i) => {
    if (link === undefined) return;
    const x = blocks[link.a]!;
    const y = blocks[link.b]!;
    if (x.reversingSection || y.reversingSection || oddComponents.has(component[link.a]!)) return;
    if (!jointAgrees({ end: link.aEnd, positiveRail: x.positiveRail }, { end: link.bEnd, positiveRail: y.positiveRail })) mismatched.push(i);
  });
  return { reversingLoops, mismatched };
}

/** The blocks of the loop a non-tree edge u–v closes: u up to the common ancestor and down to v. */
function loopThrough(u: number, v: number, parent: Int32Array, depth: Int32Array): number[] {
  const up: number[] = [];
  const down: number[] = [];
  let x = u;
  let y = v;
  let guard = 0;
  while (x !== y && guard++ < 4 * parent.length) {
    if (depth[x]! >= depth[y]!) {
      up.push(x);
      x = parent[x]!;
    } else {
      down.push(y);
      y = parent[y]!;
    }
  }
  const loop = [...up, x, ...down.reverse()];
  return loop.length > LOOP_NAMES_CAP ? loop.slice(0, LOOP_NAMES_CAP) : loop;
}
