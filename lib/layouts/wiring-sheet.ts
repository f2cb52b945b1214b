import 'server-only';
import { z } from 'zod';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { saveWiringSheetRow } from '@/db/queries/wiring-sheets';
import { wiringSheetSchema } from '@/lib/control';
import { AppError, conflict, parseOrThrow } from '@/lib/errors';
import type { LayoutContext } from '@/lib/auth/layouts';

/** What the wiring form posts: the sheet as JSON text (at most 200 KB) and the version it saw (empty: a new sheet). */
export const wiringFormSchema = z.object({
  sheet: z.string().min(2, 'paste the wiring sheet').max(200_000, 'must be 200 KB or less'),
  version: z
    .string()
    .regex(/^\d{0,9}$/, 'must be a whole number')
    .transform((v) => (v === '' ? null : Number(v))),
});

/**
 * Saves a layout's wiring sheet: valid JSON, the sheet's own rules (pins that exist, none twice, PWM
 * and serial pins), and cabs and blocks that belong to this layout. The caller checked the role.
 */
export function saveWiringSheet(ctx: LayoutContext, input: z.infer<typeof wiringFormSchema>) {
  let json: unknown;
  try {
    json = JSON.parse(input.sheet);
  } catch {
    throw new AppError('bad_request', 'The wiring sheet is not valid JSON.', { issues: [{ path: 'sheet', message: 'not valid JSON' }] });
  }
  const sheet = parseOrThrow(wiringSheetSchema, json);
  const rows = loadLayoutRows(ctx.layout.id);
  const cabs = new Set(rows.cabs.map((c) => c.id));
  const blocks = new Set(rows.blocks.map((b) => b.id));
  const issues = [
    ...sheet.cabs.filter((c) => !cabs.has(c.cabId)).map((c) => ({ path: 'sheet', message: `cab "${c.cabId}" is not a cab of this layout` })),
    ...sheet.blocks.filter((b) => !blocks.has(b.blockId)).map((b) => ({ path: 'sheet', message: `block "${b.blockId}" is not a block of this layout` })),
  ];
  if (issues.length > 0) throw new AppError('bad_request', issues[0]!.message, { issues });
  const saved = saveWiringSheetRow(ctx.layout.id, JSON.stringify(sheet), input.version);
  if (!saved.ok) throw conflict(saved.current);
  return { message: 'Wiring sheet saved.', entity: 'wiring-sheet', entityId: ctx.layout.id, action: 'wiring-sheet.save' };
}
