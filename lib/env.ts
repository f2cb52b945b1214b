import { z } from 'zod';

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.string().min(1).default('data/fishplate.db'),
  NEXTAUTH_URL: z.url().default('http://localhost:3000'),
  NEXTAUTH_SECRET: z.string().min(16, 'NEXTAUTH_SECRET must be at least 16 characters').optional(),
  /** An SMTP server to send through. When unset, Fishplate starts its own local mail catcher. */
  SMTP_URL: z.string().optional(),
  LOCAL_SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  MAIL_FROM: z.string().default('Fishplate <no-reply@fishplate.example>'),
  UPLOADS_DIR: z.string().default('data/uploads'),
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | undefined;

/** Environment variables, validated once. Throws with every problem listed. */
export function env(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    throw new Error(`Invalid environment:\n${z.prettifyError(parsed.error)}`);
  }
  if (parsed.data.NODE_ENV === 'production' && !parsed.data.NEXTAUTH_SECRET) {
    throw new Error('NEXTAUTH_SECRET must be set in production');
  }
  cached = parsed.data;
  return cached;
}

/** For tests that change process.env between cases. */
export function resetEnvCache(): void {
  cached = undefined;
}
