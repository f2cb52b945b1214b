/**
 * The track diagram's placement (lib/layouts/track-diagram.ts). How a schematic is laid out is
 * common practice (a line left to right in position order, loops and sidings offset below), so the
 * checks here are the geometry's own promises: every link ends on the ends it joins, no two blocks
 * share a place, a block joined end to end is turned so the joined ends face each other, and a
 * balloon loop closes on itself.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DIAGRAM_BLOCK_CAP, layoutTrackDiagram, type DiagramLinkInput } from '@/lib/layouts/track-diagram';

const block = (id: string, positionMm: number, extra: { reversingSection?: boolean } = {}) => ({ id, name: id, positionMm, ...extra });
const link = (a: string, aEnd: 'a' | 'b', b: string, bEnd: 'a' | 'b'): DiagramLinkInput => ({ a, b, aEnd, bEnd });
const byId = (d: ReturnType<typeof layoutTrackDiagram>) => new Map(d.blocks.map((b) => [b.id, b]));

describe('layoutTrackDiagram', () => {
  it('draws a plain line left to right in one lane, each block a to b, links straight', () => {
    const d = layoutTrackDiagram([block('C', 4000), block('A', 0), block('B', 2000)], [link('A', 'b', 'B', 'a'), link('B', 'b', 'C', 'a')]);
    expect(d.blocks.map((b) => [b.id, b.column, b.lane, b.flipped])).toEqual([
      ['A', 0, 0, false],
      ['B', 1, 0, false],
      ['C', 2, 0, false],
    ]);
    expect(d.links.map((l) => l.shape)).toEqual(['through', 'through']);
    const a = byId(d).get('A')!;
    expect(a.ends.a.x).toBeLessThan(a.ends.b.x);
  });

  it('puts a passing loop beside the main line, in the same column and the next lane', () => {
    const d = layoutTrackDiagram(
      [block('West', 0), block('Main', 1000), block('Loop', 1100), block('East', 2000)],
      [link('West', 'b', 'Main', 'a'), link('West', 'b', 'Loop', 'a'), link('Main', 'b', 'East', 'a'), link('Loop', 'b', 'East', 'a')],
    );
    const at = byId(d);
    expect([at.get('Loop')!.column, at.get('Loop')!.lane]).toEqual([at.get('Main')!.column, 1]);
    expect(at.get('East')!.lane).toBe(0);
    expect(d.links.every((l) => l.shape === 'through')).toBe(true);
  });

  it('turns a block joined b end to b end, so that the joined ends face each other', () => {
    const d = layoutTrackDiagram([block('P', 0), block('Q', 1000)], [link('P', 'b', 'Q', 'b')]);
    const q = byId(d).get('Q')!;
    expect(q.flipped).toBe(true);
    expect(q.ends.b.x).toBeLessThan(q.ends.a.x);
    expect(d.links[0]!.shape).toBe('through');
  });

  it('closes a balloon loop on itself: both ends of the balloon join one end, one connector is a loop', () => {
    // The demo garden line's shape: Orchard loop's b end meets both ends of the balloon, a reversing section.
    const d = layoutTrackDiagram(
      [block('Halt', 0), block('Orchard loop', 5000), block('Balloon', 9000, { reversingSection: true })],
      [link('Halt', 'b', 'Orchard loop', 'a'), link('Orchard loop', 'b', 'Balloon', 'a'), link('Balloon', 'b', 'Orchard loop', 'b')],
    );
    expect(d.links.map((l) => l.shape).sort()).toEqual(['loop', 'through', 'through']);
    const loop = d.links.find((l) => l.shape === 'loop')!;
    expect([loop.from.blockId, loop.to.blockId].sort()).toEqual(['Balloon', 'Orchard loop']);
    expect(byId(d).get('Balloon')!.reversingSection).toBe(true);
  });

  it('is the same whatever order the blocks and links come in', () => {
    const blocks = [block('A', 0), block('B', 10), block('C', 10), block('D', 20)];
    const links = [link('A', 'b', 'B', 'a'), link('A', 'b', 'C', 'a'), link('B', 'b', 'D', 'a'), link('C', 'b', 'D', 'a')];
    expect(layoutTrackDiagram([...blocks].reverse(), [...links].reverse())).toEqual(layoutTrackDiagram(blocks, links));
  });

  it(`draws at most ${DIAGRAM_BLOCK_CAP} blocks and says how many it left out`, () => {
    const many = Array.from({ length: DIAGRAM_BLOCK_CAP + 5 }, (_, i) => block(`B${i}`, i));
    const d = layoutTrackDiagram(many, []);
    expect(d.blocks).toHaveLength(DIAGRAM_BLOCK_CAP);
    expect(d.omittedBlocks).toBe(5);
  });

  it('on any track: one place per block, every connector starts and ends on the ends it joins, through links run rightwards', () => {
    const ends = fc.constantFrom<'a' | 'b'>('a', 'b');
    const tracks = fc.integer({ min: 1, max: 12 }).chain((n) =>
      fc.record({
        positions: fc.array(fc.integer({ min: 0, max: 5 }), { minLength: n, maxLength: n }),
        links: fc.array(fc.tuple(fc.nat(n - 1), ends, fc.nat(n - 1), ends), { maxLength: 3 * n }),
      }),
    );
    fc.assert(
      fc.property(tracks, ({ positions, links }) => {
        const blocks = positions.map((p, i) => block(`K${i}`, p * 1000));
        const d = layoutTrackDiagram(blocks, links.map(([x, xe, y, ye]) => link(`K${x}`, xe, `K${y}`, ye)));
        expect(d.blocks).toHaveLength(blocks.length);
        expect(new Set(d.blocks.map((b) => `${b.column}:${b.lane}`)).size).toBe(blocks.length);
        const at = byId(d);
        for (const l of d.links) {
          const [, x0, y0] = /^M(-?[\d.]+),(-?[\d.]+)/.exec(l.d)!.map(Number);
          const [, x1, y1] = /(-?[\d.]+),(-?[\d.]+)$/.exec(l.d)!.map(Number);
          expect([x0, y0]).toEqual([at.get(l.from.blockId)!.ends[l.from.end].x, at.get(l.from.blockId)!.ends[l.from.end].y]);
          expect([x1, y1]).toEqual([at.get(l.to.blockId)!.ends[l.to.end].x, at.get(l.to.blockId)!.ends[l.to.end].y]);
          if (l.shape === 'through') expect(x1).toBeGreaterThan(x0!);
        }
        for (const b of d.blocks) {
          expect(b.ends.a.x).toBeGreaterThanOrEqual(0);
          expect(Math.max(b.ends.a.x, b.ends.b.x)).toBeLessThanOrEqual(d.width);
          expect(b.ends.a.y).toBeLessThanOrEqual(d.height);
        }
      }),
      { numRuns: 300 },
    );
  });
});
