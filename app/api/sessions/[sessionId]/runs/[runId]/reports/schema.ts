export { reportSchema } from '@/lib/validations/live';
export { runParamsSchema } from '@/lib/validations/session';
