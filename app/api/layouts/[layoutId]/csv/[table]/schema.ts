import { z } from 'zod';
import { csvTableSchema } from '@/lib/validations/layout';

export const csvParamsSchema = z.object({ layoutId: z.string().min(1).max(100), table: csvTableSchema });

/** `?mode=preview` checks and answers what would happen; `?mode=commit&basis=…` writes. */
export const csvImportQuerySchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('preview') }),
  z.object({ mode: z.literal('commit'), basis: z.string().min(1, 'Preview the file first.').max(64) }),
], { error: 'Say mode=preview or mode=commit.' });
