import { MinHeap } from './heap';

/** What findRoute needs of a plan: block lengths and the links between blocks. */
export interface TrackGraph {
  blocks: readonly { id: string; lengthMm: number }[];
  links: readonly { a: string; b: string }[];
}

/**
 * The shortest route from one block to another over the links, as block ids from `fromBlock` to
 * `toBlock` inclusive. Length is the sum of `lengthMm` over the route's blocks (Dijkstra with a
 * binary heap, O((blocks + links) log blocks)); among equally long routes the one with fewer blocks
 * wins, then the one reached through the smaller block id. `[fromBlock]` when both are the same
 * block; null when either is unknown or no route joins them.
 */
export function findRoute(track: TrackGraph, fromBlock: string, toBlock: string): string[] | null {
  const indexOf = new Map<string, number>();
  track.blocks.forEach((block, i) => {
    if (!indexOf.has(block.id)) indexOf.set(block.id, i);
  });
  const from = indexOf.get(fromBlock);
  const to = indexOf.get(toBlock);
  if (from === undefined || to === undefined) return null;
  if (from === to) return [fromBlock];

  const n = track.blocks.length;
  const neighbours: number[][] = Array.from({ length: n }, () => []);
  for (const link of track.links) {
    const a = indexOf.get(link.a);
    const b = indexOf.get(link.b);
    if (a === undefined || b === undefined || a === b) continue;
    neighbours[a]!.push(b);
    neighbours[b]!.push(a);
  }

  const distance = new Float64Array(n).fill(Infinity);
  const hops = new Int32Array(n).fill(0x7fffffff);
  const previous = new Int32Array(n).fill(-1);
  const done = new Uint8Array(n);
  type Entry = { block: number; distance: number; hops: number };
  const ids = track.blocks.map((block) => block.id);
  const heap = new MinHeap<Entry>((x, y) =>
    x.distance !== y.distance ? x.distance < y.distance : x.hops !== y.hops ? x.hops < y.hops : ids[x.block]! < ids[y.block]!,
  );
  distance[from] = track.blocks[from]!.lengthMm;
  hops[from] = 1;
  heap.push({ block: from, distance: distance[from]!, hops: 1 });

  while (heap.size > 0) {
    const entry = heap.pop()!;
    const here = entry.block;
    if (done[here] === 1) continue;
    done[here] = 1;
    if (here === to) break;
    for (const next of neighbours[here]!) {
      if (done[next] === 1) continue;
      const through = entry.distance + track.blocks[next]!.lengthMm;
      const throughHops = entry.hops + 1;
      if (through < distance[next]! || (through === distance[next]! && throughHops < hops[next]!)) {
        distance[next] = through;
        hops[next] = throughHops;
        previous[next] = here;
        heap.push({ block: next, distance: through, hops: throughHops });
      }
    }
  }

  if (done[to] !== 1) return null;
  const route: string[] = [];
  for (let at = to; at !== -1; at = previous[at]!) route.push(ids[at]!);
  return route.reverse();
}
