import { z } from 'zod';

/** `GET /api/sessions?upcoming=1` lists only sessions that have not ended yet. */
export const listSessionsQuerySchema = z.object({
  upcoming: z.enum(['0', '1'], { error: 'Use upcoming=1 or upcoming=0.' }).optional(),
});
