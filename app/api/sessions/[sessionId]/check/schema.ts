import { z } from 'zod';

export { sessionParamsSchema } from '@/lib/validations/session';

/** `?only=load`: the load profile alone, compact (the builder's Load view); absent: the whole check. */
export const checkQuerySchema = z.object({ only: z.enum(['load']).optional() }).strict();
