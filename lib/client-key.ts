import 'server-only';
import { headers } from 'next/headers';

/**
 * The caller's address for rate limits: the first X-Forwarded-For hop when a proxy sets it,
 * else X-Real-IP, else "unknown" (and outside a request, as in scripts and tests).
 */
export async function clientAddress(): Promise<string> {
  try {
    const h = await headers();
    return h.get('x-forwarded-for')?.split(',')[0]?.trim() || h.get('x-real-ip') || 'unknown';
  } catch {
    return 'unknown';
  }
}
