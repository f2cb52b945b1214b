// Blocks and links as stored, in the engine's shapes: one place that carries the ends, the wiring
// and the reversing flags from the database rows to every user of the engine. Client-safe.
import type { Plan } from '@/lib/planning';

type BlockRow = {
  id: string;
  name: string;
  lengthMm: number;
  positiveRail: 'right' | 'left';
  reversingSection: boolean;
  reversingPlace: boolean;
};
type LinkRow = { blockAId: string; blockBId: string; blockAEnd: 'a' | 'b'; blockBEnd: 'a' | 'b' };

/** A block row as the plan's block: the wiring and flags only where they differ from the defaults. */
export function planBlockOf(row: BlockRow): Plan['blocks'][number] {
  return {
    id: row.id,
    name: row.name,
    lengthMm: row.lengthMm,
    ...(row.positiveRail === 'left' ? { positiveRail: 'left' as const } : {}),
    ...(row.reversingSection ? { reversingSection: true } : {}),
    ...(row.reversingPlace ? { reversingPlace: true } : {}),
  };
}

/** A link row as the plan's rail joint, with both ends. */
export function planLinkOf(row: LinkRow): Plan['links'][number] {
  return { a: row.blockAId, b: row.blockBId, aEnd: row.blockAEnd, bEnd: row.blockBEnd };
}

/** A stored step's direction, when it was recorded. */
export function stepEndsOf(row: { fromEnd: 'a' | 'b' | null; toEnd: 'a' | 'b' | null }): { fromEnd?: 'a' | 'b'; toEnd?: 'a' | 'b' } {
  return {
    ...(row.fromEnd !== null ? { fromEnd: row.fromEnd } : {}),
    ...(row.toEnd !== null ? { toEnd: row.toEnd } : {}),
  };
}
