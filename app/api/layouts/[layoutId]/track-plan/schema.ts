import { z } from 'zod';

export const trackPlanParamsSchema = z.object({ layoutId: z.string().min(1).max(100) });

/** An upload or removal names the layout version it saw, like any edit. */
export const trackPlanVersionSchema = z.object({
  version: z.coerce.number({ error: 'The version seen is missing.' }).int().min(1, 'The version seen is missing.'),
});
