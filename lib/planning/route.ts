import { MinHeap } from './heap';
import { endAdjacency, endNode, nodeBlock, nodeEnd, otherEnd, travelOfRun, type End } from './track';

/** What the route finder needs of a plan: block lengths, reversing places and the joints. */
export interface TrackGraph {
  blocks: readonly { id: string; lengthMm: number; reversingPlace?: boolean | undefined; name?: string | undefined }[];
  links: readonly { a: string; b: string; aEnd?: End | undefined; bEnd?: End | undefined }[];
}

/** One block of a route and the direction through it: in at `fromEnd`, heading for `toEnd` (equal: it reverses there). */
export interface RouteStep {
  blockId: string;
  fromEnd: End;
  toEnd: End;
}

export type RouteResult = { ok: true; steps: RouteStep[] } | { ok: false; reason: string };

/** Most waypoints one route may pass through (a run has at most 500 steps anyway). */
export const ROUTE_WAYPOINTS_CAP = 64;

interface Found {
  cost: number;
  hops: number;
  /** States (endNode(block, heading)) from the route's start to here. */
  path: number[];
}

/**
 * The shortest route through `waypoints` (block ids, at least one) that a train can take without
 * reversing: it leaves a block by the end it heads for and enters the next by the end joined to
 * it. It may change direction only at the route's start (the train may set off either way), in a
 * block marked `reversingPlace`, and of course after the route's end. Length is the sum of
 * `lengthMm` over the route's blocks (Dijkstra over block ends, O((blocks + links) log blocks) per
 * waypoint); among equally long routes the one with fewer blocks wins, then the one reached through
 * the smaller block id. Refused with a reason when a block is unknown, when no link joins two
 * waypoints, and when every way between them needs a reversal at a junction.
 */
export function routeThrough(track: TrackGraph, waypoints: readonly string[]): RouteResult {
  if (waypoints.length === 0) return { ok: false, reason: 'a route needs at least one block' };
  if (waypoints.length > ROUTE_WAYPOINTS_CAP) return { ok: false, reason: `a route passes through at most ${ROUTE_WAYPOINTS_CAP} blocks given` };
  const indexOf = new Map<string, number>();
  track.blocks.forEach((block, i) => {
    if (!indexOf.has(block.id)) indexOf.set(block.id, i);
  });
  const label = (id: string) => track.blocks[indexOf.get(id) ?? -1]?.name ?? id;
  const points: number[] = [];
  for (const id of waypoints) {
    const i = indexOf.get(id);
    if (i === undefined) return { ok: false, reason: `unknown block "${id}"` };
    points.push(i);
  }
  const n = track.blocks.length;
  // A link from a block to itself leads nowhere new (as before blocks had ends): routes ignore it.
  const joined = endAdjacency(
    n,
    track.links.filter((link) => link.a !== link.b),
    (id) => indexOf.get(id),
  );
  const ids = track.blocks.map((block) => block.id);
  const lengths = track.blocks.map((block) => block.lengthMm);
  const turns = track.blocks.map((block) => block.reversingPlace === true);

  // The route so far, ending in the first waypoint heading either way.
  let arrivals: (Found | undefined)[] = (['a', 'b'] as End[]).map((heading) => ({
    cost: lengths[points[0]!]!,
    hops: 1,
    path: [endNode(points[0]!, heading)],
  }));
  for (let w = 1; w < points.length; w++) {
    const to = points[w]!;
    const next = shortestLeg(arrivals, to, joined, lengths, turns, ids);
    if (next.every((found) => found === undefined)) {
      const from = ids[points[w - 1]!]!;
      if (!undirectedReach(points[w - 1]!, to, joined)) {
        return { ok: false, reason: `no line joins ${label(from)} to ${label(ids[to]!)}` };
      }
      const where = junctionNeedingReversal(track, points[w - 1]!, to, joined, lengths, ids);
      return {
        ok: false,
        reason:
          `every way from ${label(from)} to ${label(ids[to]!)} needs the train to reverse` +
          (where === null ? '' : ` (at ${label(where)})`) +
          ': end the run where it must reverse and start another from there, or mark a block where trains may reverse',
      };
    }
    arrivals = next;
  }
  const best = pickBetter(arrivals[0], arrivals[1])!;
  return { ok: true, steps: statesToSteps(best.path, ids) };
}

/**
 * The shortest route from one block to another, as block ids from `fromBlock` to `toBlock` inclusive
 * (see routeThrough): `[fromBlock]` when both are the same block; null when either is unknown or no
 * route joins them without a reversal.
 */
export function findRoute(track: TrackGraph, fromBlock: string, toBlock: string): string[] | null {
  const route = routeThrough(track, [fromBlock, toBlock]);
  return route.ok ? route.steps.map((step) => step.blockId) : null;
}

function less(x: { cost: number; hops: number; block: number }, y: { cost: number; hops: number; block: number }, ids: readonly string[]) {
  return x.cost !== y.cost ? x.cost < y.cost : x.hops !== y.hops ? x.hops < y.hops : ids[x.block]! < ids[y.block]!;
}

/** The shorter of two routes, then the one with fewer blocks; the first on a tie. */
function pickBetter(x: Found | undefined, y: Found | undefined): Found | undefined {
  if (x === undefined) return y;
  if (y === undefined) return x;
  return y.cost < x.cost || (y.cost === x.cost && y.hops < x.hops) ? y : x;
}

/**
 * Dijkstra over states "in block i heading for end e" (node endNode(i, e)) from the given starts,
 * to the two states of block `to`. Moves: over a joint from the end headed for into the joined
 * block, heading for its far end (cost: that block's length); in a reversing place, turn round (no
 * cost, but a hop, so a route does not turn for nothing).
 */
function shortestLeg(
  starts: readonly (Found | undefined)[],
  to: number,
  joined: readonly number[][],
  lengths: readonly number[],
  turns: readonly boolean[],
  ids: readonly string[],
): (Found | undefined)[] {
  const states = joined.length;
  const cost = new Float64Array(states).fill(Infinity);
  const hops = new Int32Array(states).fill(0x7fffffff);
  const previous = new Int32Array(states).fill(-1);
  const origin = new Int32Array(states).fill(-1);
  const done = new Uint8Array(states);
  type Entry = { state: number; cost: number; hops: number; block: number };
  const heap = new MinHeap<Entry>((x, y) => less(x, y, ids));
  starts.forEach((found, s) => {
    if (found === undefined) return;
    const state = found.path[found.path.length - 1]!;
    if (found.cost < cost[state]! || (found.cost === cost[state]! && found.hops < hops[state]!)) {
      cost[state] = found.cost;
      hops[state] = found.hops;
      origin[state] = s;
      previous[state] = -1;
      heap.push({ state, cost: found.cost, hops: found.hops, block: nodeBlock(state) });
    }
  });
  const relax = (from: number, state: number, through: number, throughHops: number) => {
    if (done[state] === 1) return;
    if (through < cost[state]! || (through === cost[state]! && throughHops < hops[state]!)) {
      cost[state] = through;
      hops[state] = throughHops;
      previous[state] = from;
      origin[state] = origin[from]!;
      heap.push({ state, cost: through, hops: throughHops, block: nodeBlock(state) });
    }
  };
  let reached = 0;
  while (heap.size > 0 && reached < 2) {
    const entry = heap.pop()!;
    const here = entry.state;
    if (done[here] === 1) continue;
    done[here] = 1;
    const block = nodeBlock(here);
    if (block === to) {
      reached++;
      continue;
    }
    for (const node of joined[here]!) {
      const next = nodeBlock(node);
      relax(here, endNode(next, otherEnd(nodeEnd(node))), entry.cost + lengths[next]!, entry.hops + 1);
    }
    if (turns[block]) relax(here, endNode(block, otherEnd(nodeEnd(here))), entry.cost, entry.hops + 1);
  }
  return (['a', 'b'] as End[]).map((heading) => {
    const goal = endNode(to, heading);
    if (done[goal] !== 1) return undefined;
    const tail: number[] = [];
    for (let at = goal; at !== -1; at = previous[at]!) tail.push(at);
    tail.reverse();
    const start = starts[origin[goal]!]!;
    return { cost: cost[goal]!, hops: hops[goal]!, path: [...start.path, ...tail.slice(1)] };
  });
}

/** States to steps: a turn (two states in one block) is one step that comes in and leaves by the same end. */
function statesToSteps(path: readonly number[], ids: readonly string[]): RouteStep[] {
  const steps: RouteStep[] = [];
  path.forEach((state, i) => {
    const block = nodeBlock(state);
    const heading = nodeEnd(state);
    const last = steps[steps.length - 1];
    if (i > 0 && last !== undefined && nodeBlock(path[i - 1]!) === block && last.blockId === ids[block]) {
      last.toEnd = heading;
      return;
    }
    steps.push({ blockId: ids[block]!, fromEnd: otherEnd(heading), toEnd: heading });
  });
  return steps;
}

function undirectedReach(from: number, to: number, joined: readonly number[][]): boolean {
  const seen = new Uint8Array(joined.length / 2);
  const queue = [from];
  seen[from] = 1;
  for (let q = 0; q < queue.length; q++) {
    const block = queue[q]!;
    if (block === to) return true;
    for (const end of [0, 1]) {
      for (const node of joined[2 * block + end]!) {
        const next = nodeBlock(node);
        if (seen[next] === 0) {
          seen[next] = 1;
          queue.push(next);
        }
      }
    }
  }
  return false;
}

/** The first block where the shortest way that ignores direction turns round, for the refusal message. */
function junctionNeedingReversal(
  track: TrackGraph,
  from: number,
  to: number,
  joined: readonly number[][],
  lengths: readonly number[],
  ids: readonly string[],
): string | null {
  const asGraph: number[][] = Array.from({ length: lengths.length }, () => []);
  for (let node = 0; node < joined.length; node++) for (const other of joined[node]!) asGraph[nodeBlock(node)]!.push(nodeBlock(other));
  const distance = new Float64Array(lengths.length).fill(Infinity);
  const previous = new Int32Array(lengths.length).fill(-1);
  const done = new Uint8Array(lengths.length);
  const heap = new MinHeap<{ block: number; cost: number; hops: number }>((x, y) => less(x, y, ids));
  distance[from] = lengths[from]!;
  heap.push({ block: from, cost: distance[from]!, hops: 1 });
  while (heap.size > 0) {
    const { block, cost } = heap.pop()!;
    if (done[block] === 1) continue;
    done[block] = 1;
    if (block === to) break;
    for (const next of asGraph[block]!) {
      if (done[next] === 1 || !(cost + lengths[next]! < distance[next]!)) continue;
      distance[next] = cost + lengths[next]!;
      previous[next] = block;
      heap.push({ block: next, cost: distance[next]!, hops: 0 });
    }
  }
  if (done[to] !== 1) return null;
  const blocks: number[] = [];
  for (let at = to; at !== -1; at = previous[at]!) blocks.push(at);
  blocks.reverse();
  const travel = travelOfRun(
    blocks.map((block) => ({ block })),
    joined,
  );
  for (let k = 1; k < blocks.length - 1; k++) if (travel.fromEnd[k] === travel.toEnd[k]) return track.blocks[blocks[k]!]!.id;
  return null;
}
