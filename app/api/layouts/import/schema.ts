import { z } from 'zod';

/** A plan file to become a new layout of `railwayId`; `name` overrides the one in the file. */
export const planImportSchema = z.object({
  railwayId: z.string().min(1, 'Say which railway.').max(100),
  name: z.string().trim().max(80, 'Use at most 80 characters.').optional(),
  plan: z.unknown().refine((v) => typeof v === 'object' && v !== null, 'Attach a plan file (JSON).'),
});

/** A plan file to import as a layout: 2 MB holds thousands of blocks and trains (its runs are left out). */
export const LAYOUT_IMPORT_MAX_BYTES = 2_000_000;
