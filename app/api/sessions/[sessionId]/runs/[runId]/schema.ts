import { z } from 'zod';

export { runParamsSchema, updateRunSchema } from '@/lib/validations/session';

/** `DELETE ...?version=3`: the version of the run the caller saw. */
export const deleteRunQuerySchema = z.object({
  version: z.coerce.number({ error: 'Say which version of the run you are deleting (?version=).' }).int().min(1, 'Say which version of the run you are deleting (?version=).'),
});
