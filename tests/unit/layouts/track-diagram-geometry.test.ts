/**
 * The track diagram's geometry by value (lib/layouts/track-diagram.ts): where each block's ends fall
 * on the grid (column 168, segment 120, lane 72, margin 28, top 34 user units), the connectors'
 * path data, the drawing's size, and what it leaves out. Path data is checked against the SVG path
 * grammar (SVG 1.1, 8.3 "Path data": moveto M, curveto C with two control points, smooth curveto S
 * whose first control point is the reflection of the previous one). The layout rules themselves are
 * common practice (see track-diagram.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { layoutTrackDiagram, type DiagramBlockInput, type DiagramLinkInput } from '@/lib/layouts/track-diagram';

const block = (id: string, positionMm: number, extra: Partial<DiagramBlockInput> = {}): DiagramBlockInput => ({ id, name: id, positionMm, ...extra });
const link = (a: string, aEnd: 'a' | 'b', b: string, bEnd: 'a' | 'b'): DiagramLinkInput => ({ a, b, aEnd, bEnd });
const placeOf = (d: ReturnType<typeof layoutTrackDiagram>) => Object.fromEntries(d.blocks.map((b) => [b.id, [b.column, b.lane, b.flipped]]));
const endsOf = (d: ReturnType<typeof layoutTrackDiagram>, id: string) => d.blocks.find((b) => b.id === id)!.ends;

/** SVG 1.1 8.3.9 grammar, for the two forms the diagram writes (absolute M C and M C S, comma-separated pairs). */
const num = String.raw`-?\d+(?:\.\d+)?(?:e-?\d+)?`;
const pair = `${num},${num}`;
const THROUGH = new RegExp(`^M${pair} C${pair} ${pair} ${pair}$`);
const LOOP = new RegExp(`^M${pair} C${pair} ${pair} ${pair} S${pair} ${pair}$`);
/** The numbers of a path, to compare with toBeCloseTo (0.45 and 0.62 are not exact in binary). */
const numbersOf = (d: string) => [...d.matchAll(new RegExp(num, 'g'))].map((m) => Number(m[0]));
function expectPath(d: string, form: RegExp, expected: number[]) {
  expect(d).toMatch(form);
  const got = numbersOf(d);
  expect(got).toHaveLength(expected.length);
  got.forEach((n, i) => expect(n, `number ${i} of ${d}`).toBeCloseTo(expected[i]!, 9));
}

// reach = 0.45 × 168 = 75.6; a loop's low point lies 0.62 × 72 = 44.64 below the lower end.
const REACH = 75.6;
const DROP = 44.64;

describe('layoutTrackDiagram geometry', () => {
  it('places a line of three blocks on the grid and joins them with straight curves', () => {
    const d = layoutTrackDiagram([block('A', 0), block('B', 1000), block('C', 2000)], [link('A', 'b', 'B', 'a'), link('B', 'b', 'C', 'a')]);
    // Column c starts at 28 + 168c; a segment is 120 long; lane 0 is at y = 34.
    expect(d.blocks.map((b) => [b.id, b.ends.a, b.ends.b])).toEqual([
      ['A', { x: 28, y: 34 }, { x: 148, y: 34 }],
      ['B', { x: 196, y: 34 }, { x: 316, y: 34 }],
      ['C', { x: 364, y: 34 }, { x: 484, y: 34 }],
    ]);
    // Control points halfway across the 48-unit gap: k = 24.
    expect(d.links.map((l) => [l.from, l.to, l.shape, l.d])).toEqual([
      [{ blockId: 'A', end: 'b' }, { blockId: 'B', end: 'a' }, 'through', 'M148,34 C172,34 172,34 196,34'],
      [{ blockId: 'B', end: 'b' }, { blockId: 'C', end: 'a' }, 'through', 'M316,34 C340,34 340,34 364,34'],
    ]);
    for (const l of d.links) expect(l.d).toMatch(THROUGH);
    // 2 × 28 + 2 × 168 + 120 wide; 34 + 72 high; no loop, so no room for one.
    expect([d.width, d.height, d.omittedBlocks, d.omittedLinks]).toEqual([512, 106, 0, 0]);
  });

  it('sizes a single block, and an empty diagram, from the grid alone', () => {
    const one = layoutTrackDiagram([block('Solo', 0)], []);
    expect([one.width, one.height]).toEqual([176, 106]);
    expect(one.blocks[0]).toEqual({ id: 'Solo', name: 'Solo', column: 0, lane: 0, flipped: false, reversingSection: false, reversingPlace: false, ends: { a: { x: 28, y: 34 }, b: { x: 148, y: 34 } } });
    const none = layoutTrackDiagram([], []);
    expect([none.width, none.height, none.blocks, none.links]).toEqual([176, 106, [], []]);
  });

  it('draws a passing loop’s road one lane down with S-shaped connectors, and makes the drawing a lane taller', () => {
    const d = layoutTrackDiagram(
      [block('West', 0), block('Main', 1000), block('Loop', 1100), block('East', 2000)],
      [link('West', 'b', 'Main', 'a'), link('West', 'b', 'Loop', 'a'), link('Main', 'b', 'East', 'a'), link('Loop', 'b', 'East', 'a')],
    );
    expect(endsOf(d, 'Loop')).toEqual({ a: { x: 196, y: 106 }, b: { x: 316, y: 106 } });
    expect(d.links.map((l) => l.d)).toEqual([
      'M148,34 C172,34 172,34 196,34',
      'M148,34 C172,34 172,106 196,106',
      'M316,34 C340,34 340,34 364,34',
      'M316,106 C340,106 340,34 364,34',
    ]);
    expect([d.width, d.height]).toEqual([512, 178]);
  });

  it('places a block joined at the left-hand end one column left, turned so the joined end faces right', () => {
    // Root R is first by position; L1 joins R's a end with its a end (so L1 is drawn b end first),
    // L2 with its b end (drawn a end first), one lane down.
    const d = layoutTrackDiagram([block('R', 0), block('L1', 10), block('L2', 20)], [link('R', 'a', 'L1', 'a'), link('L2', 'b', 'R', 'a')]);
    expect(placeOf(d)).toEqual({ R: [1, 0, false], L1: [0, 0, true], L2: [0, 1, false] });
    expect(endsOf(d, 'L1')).toEqual({ b: { x: 28, y: 34 }, a: { x: 148, y: 34 } });
    expect(endsOf(d, 'L2')).toEqual({ a: { x: 28, y: 106 }, b: { x: 148, y: 106 } });
    // Drawn left to right: from the left block's right-facing end to R's a end.
    expect(d.links.map((l) => [l.from, l.to, l.shape, l.d])).toEqual([
      [{ blockId: 'L1', end: 'a' }, { blockId: 'R', end: 'a' }, 'through', 'M148,34 C172,34 172,34 196,34'],
      [{ blockId: 'L2', end: 'b' }, { blockId: 'R', end: 'a' }, 'through', 'M148,106 C172,106 172,34 196,34'],
    ]);
  });

  it('turns a block joined at the right-hand end by its b end', () => {
    const d = layoutTrackDiagram([block('P', 0), block('Q', 10), block('S', 20)], [link('P', 'b', 'Q', 'b'), link('Q', 'a', 'S', 'a')]);
    expect(placeOf(d)).toEqual({ P: [0, 0, false], Q: [1, 0, true], S: [2, 0, false] });
  });

  it('draws a balloon loop round below its lane, out of each end the way it faces', () => {
    const d = layoutTrackDiagram(
      [block('Halt', 0), block('Orchard', 5000), block('Balloon', 9000, { reversingSection: true, reversingPlace: true })],
      [link('Halt', 'b', 'Orchard', 'a'), link('Orchard', 'b', 'Balloon', 'a'), link('Balloon', 'b', 'Orchard', 'b')],
    );
    const loop = d.links[2]!;
    expect([loop.from, loop.to, loop.shape]).toEqual([{ blockId: 'Orchard', end: 'b' }, { blockId: 'Balloon', end: 'b' }, 'loop']);
    // P = Orchard b (316, 34) and Q = Balloon b (484, 34) both face right: the low point is halfway
    // across plus one reach, 400 + 75.6.
    expectPath(loop.d, LOOP, [316, 34, 316 + REACH, 34, 316 + REACH, 34 + DROP, 400 + REACH, 34 + DROP, 484 + REACH, 34, 484, 34]);
    expect(d.blocks.map((b) => [b.id, b.reversingSection, b.reversingPlace])).toEqual([
      ['Halt', false, false],
      ['Orchard', false, false],
      ['Balloon', true, true],
    ]);
    // Room for the loop beyond the last column: half a column more.
    expect([d.width, d.height]).toEqual([512 + 84, 106]);
  });

  it('draws a loop between a right-facing and a left-facing end that runs backwards', () => {
    // Q's b end (316) back to P's a end (28): the ends face apart, so the curve goes out right, round
    // below, and in from the left; the two reaches cancel at the midpoint 172.
    const d = layoutTrackDiagram([block('P', 0), block('Q', 10)], [link('P', 'b', 'Q', 'a'), link('P', 'a', 'Q', 'b')]);
    const loop = d.links.find((l) => l.shape === 'loop')!;
    expect([loop.from, loop.to]).toEqual([{ blockId: 'Q', end: 'b' }, { blockId: 'P', end: 'a' }]);
    expectPath(loop.d, LOOP, [316, 34, 316 + REACH, 34, 316 + REACH, 34 + DROP, 172, 34 + DROP, 28 - REACH, 34, 28, 34]);
  });

  it('draws a loop between two left-facing ends from the first block by position', () => {
    const d = layoutTrackDiagram([block('Halt', 0), block('Balloon', 10)], [link('Balloon', 'b', 'Halt', 'a'), link('Balloon', 'a', 'Halt', 'a')]);
    // Both Balloon ends join Halt's a end; the a end comes first, so Balloon is drawn b end first.
    expect(placeOf(d)).toEqual({ Halt: [1, 0, false], Balloon: [0, 0, true] });
    const loop = d.links.find((l) => l.shape === 'loop')!;
    expect([loop.from, loop.to]).toEqual([{ blockId: 'Halt', end: 'a' }, { blockId: 'Balloon', end: 'b' }]);
    // P = Halt a (196, 34), Q = Balloon b (28, 34), both facing left: the low point is halfway
    // across less one reach, 112 − 75.6.
    expectPath(loop.d, LOOP, [196, 34, 196 - REACH, 34, 196 - REACH, 34 + DROP, 112 - REACH, 34 + DROP, 28 - REACH, 34, 28, 34]);
  });

  it('draws a loop between two left-facing ends as a loop even when it runs rightwards', () => {
    const d = layoutTrackDiagram([block('Balloon', 0), block('Halt', 10)], [link('Balloon', 'b', 'Halt', 'a'), link('Balloon', 'a', 'Halt', 'a')]);
    expect(placeOf(d)).toEqual({ Balloon: [0, 0, false], Halt: [1, 0, false] });
    const loop = d.links[0]!;
    expect([loop.from, loop.to, loop.shape]).toEqual([{ blockId: 'Balloon', end: 'a' }, { blockId: 'Halt', end: 'a' }, 'loop']);
    // P = Balloon a (28, 34), Q = Halt a (196, 34), both facing left.
    expectPath(loop.d, LOOP, [28, 34, 28 - REACH, 34, 28 - REACH, 34 + DROP, 112 - REACH, 34 + DROP, 196 - REACH, 34, 196, 34]);
  });

  it('takes a loop between two lanes round below the lower one', () => {
    const d = layoutTrackDiagram(
      [block('Main', 0), block('Up', 10), block('Down', 20)],
      [link('Main', 'b', 'Up', 'a'), link('Main', 'b', 'Down', 'a'), link('Up', 'b', 'Down', 'b')],
    );
    const loop = d.links.find((l) => l.shape === 'loop')!;
    expect([loop.from, loop.to]).toEqual([{ blockId: 'Up', end: 'b' }, { blockId: 'Down', end: 'b' }]);
    expectPath(loop.d, LOOP, [316, 34, 316 + REACH, 34, 316 + REACH, 106 + DROP, 316 + REACH, 106 + DROP, 316 + REACH, 106, 316, 106]);
  });

  it('orders connectors by their first-ranked block, whichever block a link names first', () => {
    // C hangs off A's a end (turned, a end right), B off C's left-hand b end: B C A left to right.
    const d = layoutTrackDiagram([block('A', 0), block('B', 10), block('C', 20)], [link('C', 'a', 'A', 'a'), link('B', 'b', 'C', 'b')]);
    expect(placeOf(d)).toEqual({ A: [2, 0, false], B: [0, 0, false], C: [1, 0, true] });
    expect(d.links.map((l) => [l.from.blockId, l.from.end, l.to.blockId, l.to.end, l.d])).toEqual([
      ['C', 'a', 'A', 'a', 'M316,34 C340,34 340,34 364,34'],
      ['B', 'b', 'C', 'b', 'M148,34 C172,34 172,34 196,34'],
    ]);
  });

  it('draws a joint once however often and from whichever side it is named, and counts it once', () => {
    const d = layoutTrackDiagram([block('A', 0), block('B', 10), block('C', 20)], [link('A', 'b', 'B', 'a'), link('B', 'a', 'A', 'b'), link('C', 'a', 'B', 'b'), link('A', 'b', 'B', 'a')]);
    expect(d.links.map((l) => `${l.from.blockId}${l.from.end}-${l.to.blockId}${l.to.end}`)).toEqual(['Ab-Ba', 'Bb-Ca']);
    expect(d.omittedLinks).toBe(0);
  });

  it('leaves out links to blocks it does not draw and a block’s link to itself', () => {
    const d = layoutTrackDiagram([block('A', 0), block('B', 10)], [link('A', 'b', 'Nowhere', 'a'), link('Gone', 'b', 'B', 'a'), link('A', 'a', 'A', 'b')]);
    expect([d.links, d.omittedLinks]).toEqual([[], 0]);
    expect(placeOf(d)).toEqual({ A: [0, 0, false], B: [0, 1, false] });
  });

  it('reaches a block through a link named from the block placed later', () => {
    // C (placed from A) leads on to B: B is found from C's own list of joints.
    const d = layoutTrackDiagram([block('A', 0), block('B', 10), block('C', 20)], [link('A', 'b', 'C', 'a'), link('C', 'b', 'B', 'a')]);
    expect(placeOf(d)).toEqual({ A: [0, 0, false], C: [1, 0, false], B: [2, 0, false] });
  });

  it('places the blocks joined at one end in the order of their rank, whatever order the links come in', () => {
    const blocks = [block('R', 0), block('X1', 10), block('X2', 20), block('X3', 30)];
    const links = [link('X3', 'b', 'R', 'a'), link('X1', 'b', 'R', 'a'), link('X2', 'b', 'R', 'a')];
    const want = { R: [1, 0, false], X1: [0, 0, false], X2: [0, 1, false], X3: [0, 2, false] };
    expect(placeOf(layoutTrackDiagram(blocks, links))).toEqual(want);
    expect(placeOf(layoutTrackDiagram(blocks, [links[1]!, links[2]!, links[0]!]))).toEqual(want);
    expect(placeOf(layoutTrackDiagram(blocks, [links[2]!, links[0]!, links[1]!]))).toEqual(want);
  });

  it('ranks blocks at one position by name, then by id, then as given', () => {
    const d = layoutTrackDiagram([block('z1', 0, { name: 'Zed' }), block('a1', 0, { name: 'Amy' }), block('m2', 0, { name: 'Mo' }), block('m1', 0, { name: 'Mo' })], []);
    expect(d.blocks.map((b) => [b.id, b.lane])).toEqual([
      ['a1', 0],
      ['m1', 1],
      ['m2', 2],
      ['z1', 3],
    ]);
    const same = layoutTrackDiagram([block('x', 0, { reversingSection: true }), block('x', 0), block('x', 0, { reversingPlace: true })], []);
    expect(same.blocks.map((b) => [b.reversingSection, b.reversingPlace, b.lane])).toEqual([
      [true, false, 0],
      [false, false, 1],
      [false, true, 2],
    ]);
  });

  it('joins a link to the first of two blocks that share an id', () => {
    const d = layoutTrackDiagram([block('A', 0, { name: 'One' }), block('A', 10, { name: 'Two' }), block('B', 20)], [link('A', 'b', 'B', 'a')]);
    expect(d.blocks.map((b) => [b.name, b.column, b.lane])).toEqual([
      ['One', 0, 0],
      ['Two', 0, 1],
      ['B', 1, 0],
    ]);
  });

  it('draws at most 600 links and counts the rest', () => {
    const blocks = Array.from({ length: 250 }, (_, i) => block(`K${i}`, i));
    const links: DiagramLinkInput[] = [];
    for (let i = 0; i < 249; i++) links.push(link(`K${i}`, 'b', `K${i + 1}`, 'a'), link(`K${i}`, 'a', `K${i + 1}`, 'b'), link(`K${i}`, 'b', `K${i + 1}`, 'b'));
    const d = layoutTrackDiagram(blocks, links);
    expect([d.links.length, d.omittedLinks]).toEqual([600, 3 * 249 - 600]);
  });
});
