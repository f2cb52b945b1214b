export { seriesSchema } from '@/lib/runs/schema';
export { runParamsSchema } from '@/lib/validations/session';
