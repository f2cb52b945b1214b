import { z } from 'zod';

export { sessionParamsSchema } from '@/lib/validations/session';

/** `?board=` picks one board of the layout's wiring sheet where it has several. */
export const controlQuerySchema = z.object({
  board: z.string().min(1, 'must not be empty').max(100, 'must be 100 characters or fewer').optional(),
});
