import { linkEnds, otherEnd, type End } from '@/lib/planning/track';

/**
 * A schematic of a layout's track, placed from its blocks and links alone (no drawing is stored):
 * a deterministic layered layout. Blocks are visited in position order; the first of each part of
 * the track that is not joined to the rest starts a row with its `a` end on the left. Walking the
 * links from each placed block's ends, a block joined at the right-hand end goes one column to the
 * right, at the left-hand end one column to the left, turned so that the joined end faces the block
 * it came from (so a block may be drawn `b` end first). The first block joined at an end stays in
 * the lane it came from; further ones (a turnout's other road) go to the next free lane below. A
 * link between two blocks already placed is drawn as it falls: a straight or S-shaped connector
 * when it runs from a right-facing end to a left-facing end further right, otherwise a loop that
 * leaves and enters each end the way it faces (a balloon loop or wye closing on itself).
 */

export interface DiagramBlockInput {
  id: string;
  name: string;
  positionMm: number;
  reversingSection?: boolean | undefined;
  reversingPlace?: boolean | undefined;
}

export interface DiagramLinkInput {
  a: string;
  b: string;
  aEnd?: End | undefined;
  bEnd?: End | undefined;
}

/** Most blocks one diagram draws: the rest are listed in the blocks table only. */
export const DIAGRAM_BLOCK_CAP = 300;
/** Most links one diagram draws (two per block is a full layout of turnouts). */
export const DIAGRAM_LINK_CAP = 2 * DIAGRAM_BLOCK_CAP;

/** Drawing grid, in SVG user units (px at 100 %). */
export const DIAGRAM_GRID = { column: 168, segment: 120, lane: 72, margin: 28, top: 34 } as const;

export interface PlacedBlock {
  id: string;
  name: string;
  column: number;
  lane: number;
  /** Drawn with its `b` end on the left. */
  flipped: boolean;
  reversingSection: boolean;
  reversingPlace: boolean;
  /** The segment's ends, `a` and `b`, in user units. */
  ends: Record<End, { x: number; y: number }>;
}

export interface PlacedLink {
  from: { blockId: string; end: End };
  to: { blockId: string; end: End };
  /** `through`: left to right between facing ends; `loop`: turns back on itself (a balloon loop or wye). */
  shape: 'through' | 'loop';
  /** SVG path data. */
  d: string;
}

export interface TrackDiagram {
  blocks: PlacedBlock[];
  links: PlacedLink[];
  width: number;
  height: number;
  /** Blocks and links left out past the caps. */
  omittedBlocks: number;
  omittedLinks: number;
}

type Joint = { to: number; toEnd: End };

/** Lays the track out for drawing; deterministic for one set of blocks and links. */
export function layoutTrackDiagram(blocksIn: readonly DiagramBlockInput[], linksIn: readonly DiagramLinkInput[]): TrackDiagram {
  const sorted = blocksIn
    .map((block, i) => ({ block, i }))
    .sort((x, y) => x.block.positionMm - y.block.positionMm || cmp(x.block.name, y.block.name) || cmp(x.block.id, y.block.id) || x.i - y.i)
    .map((x) => x.block);
  const blocks = sorted.slice(0, DIAGRAM_BLOCK_CAP);
  const rank = new Map<string, number>();
  blocks.forEach((b, i) => {
    if (!rank.has(b.id)) rank.set(b.id, i);
  });
  const n = blocks.length;
  const joints: Record<End, Joint[]>[] = Array.from({ length: n }, () => ({ a: [], b: [] }));
  const drawn: { x: number; xEnd: End; y: number; yEnd: End }[] = [];
  let candidateLinks = 0;
  const seen = new Set<string>();
  for (const link of linksIn) {
    const x = rank.get(link.a);
    const y = rank.get(link.b);
    if (x === undefined || y === undefined || x === y) continue;
    const { aEnd, bEnd } = linkEnds(link);
    const key = x < y ? `${x}${aEnd}-${y}${bEnd}` : `${y}${bEnd}-${x}${aEnd}`;
    if (seen.has(key)) continue;
    seen.add(key);
    candidateLinks++;
    if (drawn.length >= DIAGRAM_LINK_CAP) continue;
    drawn.push(x < y ? { x, xEnd: aEnd, y, yEnd: bEnd } : { x: y, xEnd: bEnd, y: x, yEnd: aEnd });
    joints[x]![aEnd].push({ to: y, toEnd: bEnd });
    joints[y]![bEnd].push({ to: x, toEnd: aEnd });
  }
  drawn.sort((p, q) => p.x - q.x || cmp(p.xEnd, q.xEnd) || p.y - q.y || cmp(p.yEnd, q.yEnd));
  for (const j of joints) {
    j.a.sort((p, q) => p.to - q.to || cmp(p.toEnd, q.toEnd));
    j.b.sort((p, q) => p.to - q.to || cmp(p.toEnd, q.toEnd));
  }

  const column = new Array<number>(n).fill(0);
  const lane = new Array<number>(n).fill(-1);
  const flipped = new Array<boolean>(n).fill(false);
  const taken = new Set<string>();
  const cell = (c: number, l: number) => `${c}:${l}`;
  let nextBand = 0;
  for (let root = 0; root < n; root++) {
    if (lane[root] !== -1) continue;
    const members = [root];
    column[root] = 0;
    lane[root] = nextBand;
    taken.add(cell(0, nextBand));
    for (let q = 0; q < members.length; q++) {
      const u = members[q]!;
      const right: End = flipped[u] ? 'a' : 'b';
      for (const end of [right, otherEnd(right)]) {
        const step = end === right ? 1 : -1;
        for (const joint of joints[u]![end]) {
          const v = joint.to;
          if (lane[v] !== -1) continue;
          const c = column[u]! + step;
          let l = lane[u]!;
          while (taken.has(cell(c, l))) l++;
          column[v] = c;
          lane[v] = l;
          // The joined end faces back towards u: on the left when v is to the right of u.
          flipped[v] = step === 1 ? joint.toEnd === 'b' : joint.toEnd === 'a';
          taken.add(cell(c, l));
          members.push(v);
        }
      }
    }
    const shift = Math.min(...members.map((m) => column[m]!));
    for (const m of members) column[m] = column[m]! - shift;
    nextBand = Math.max(...members.map((m) => lane[m]!)) + 1;
  }

  const g = DIAGRAM_GRID;
  const placed: PlacedBlock[] = blocks.map((b, i) => {
    const left = g.margin + column[i]! * g.column;
    const y = g.top + lane[i]! * g.lane;
    const leftEnd: End = flipped[i] ? 'b' : 'a';
    const ends = { [leftEnd]: { x: left, y }, [otherEnd(leftEnd)]: { x: left + g.segment, y } } as Record<End, { x: number; y: number }>;
    return {
      id: b.id,
      name: b.name,
      column: column[i]!,
      lane: lane[i]!,
      flipped: flipped[i]!,
      reversingSection: b.reversingSection === true,
      reversingPlace: b.reversingPlace === true,
      ends,
    };
  });
  const faces = (i: number, end: End): 1 | -1 => ((end === 'b') !== flipped[i] ? 1 : -1);
  const links: PlacedLink[] = drawn.map(({ x, xEnd, y, yEnd }) => {
    let p = { i: x, end: xEnd };
    let q = { i: y, end: yEnd };
    // Draw left to right where the link runs that way.
    if (faces(p.i, p.end) === -1 && faces(q.i, q.end) === 1) [p, q] = [q, p];
    const P = placed[p.i]!.ends[p.end];
    const Q = placed[q.i]!.ends[q.end];
    const dp = faces(p.i, p.end);
    const dq = faces(q.i, q.end);
    const from = { blockId: blocks[p.i]!.id, end: p.end };
    const to = { blockId: blocks[q.i]!.id, end: q.end };
    if (dp === 1 && dq === -1 && Q.x > P.x) {
      const k = (Q.x - P.x) / 2;
      return { from, to, shape: 'through', d: `M${P.x},${P.y} C${P.x + k},${P.y} ${Q.x - k},${Q.y} ${Q.x},${Q.y}` };
    }
    // A loop: out of each end the way it faces, round below the lanes it joins.
    const reach = g.column * 0.45;
    const below = Math.max(P.y, Q.y) + g.lane * 0.62;
    return {
      from,
      to,
      shape: 'loop',
      d: `M${P.x},${P.y} C${P.x + dp * reach},${P.y} ${P.x + dp * reach},${below} ${(P.x + Q.x) / 2 + ((dp + dq) * reach) / 2},${below} S${Q.x + dq * reach},${Q.y} ${Q.x},${Q.y}`,
    };
  });
  const columns = placed.length ? Math.max(...placed.map((b) => b.column)) + 1 : 0;
  const lanes = placed.length ? Math.max(...placed.map((b) => b.lane)) + 1 : 0;
  return {
    blocks: placed,
    links,
    width: 2 * g.margin + Math.max(0, columns - 1) * g.column + g.segment + (links.some((l) => l.shape === 'loop') ? g.column * 0.5 : 0),
    height: g.top + Math.max(0, lanes - 1) * g.lane + g.lane,
    omittedBlocks: sorted.length - blocks.length,
    omittedLinks: candidateLinks - drawn.length,
  };
}

function cmp(x: string, y: string): number {
  return x < y ? -1 : x > y ? 1 : 0;
}
