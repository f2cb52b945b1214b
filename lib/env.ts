import { z } from 'zod';
import { databaseUrlSchema } from '@/db';

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: databaseUrlSchema,
  NEXTAUTH_URL: z.url().default('http://localhost:3000'),
  NEXTAUTH_SECRET: z.string().min(16, 'NEXTAUTH_SECRET must be at least 16 characters').optional(),
  /** An SMTP server to send through. When unset, Fishplate starts its own local mail catcher. */
  SMTP_URL: z.string().optional(),
  LOCAL_SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  MAIL_FROM: z.string().default('Fishplate <no-reply@fishplate.example>'),
  UPLOADS_DIR: z.string().default('data/uploads'),
  /** The port the local mail catcher really listens on (set by the server at start; tests set it too). */
  LOCAL_SMTP_ACTUAL_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  /** 1: the sign-in page lists the demo accounts. */
  FISHPLATE_DEMO: z.enum(['0', '1']).default('0'),
  /**
   * Comma-separated addresses of the reverse proxies in front of Fishplate. Only a request whose
   * socket peer is one of them has its X-Forwarded-For read (from the right); unset, forwarding
   * headers are ignored and each socket peer is one client for the limits.
   */
  TRUSTED_PROXIES: z
    .string()
    .default('')
    .transform((text) => text.split(',').map((a) => a.trim()).filter(Boolean))
    .pipe(z.array(z.union([z.ipv4(), z.ipv6()], { error: 'TRUSTED_PROXIES lists IP addresses, comma-separated' })).max(20)),
  /** off: no outbox worker in this process (benchmarks, tests that deliver by hand). */
  FISHPLATE_OUTBOX_WORKER: z.enum(['on', 'off']).default('on'),
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

/**
 * The port the local mail catcher listens on now. Read fresh on each call, not from the cached env():
 * the server sets it after the catcher has started, which is after the first env() read.
 */
export function localSmtpActualPort(): number | undefined {
  return envSchema.shape.LOCAL_SMTP_ACTUAL_PORT.parse(process.env.LOCAL_SMTP_ACTUAL_PORT || undefined);
}

/** For tests that change process.env between cases. */
export function resetEnvCache(): void {
  cached = undefined;
}
