import 'server-only';
import { notFound, redirect } from 'next/navigation';
import type { Role } from '@/db/schema';
import { requireMember, type Member } from '@/lib/auth';
import { AppError } from '@/lib/errors';

/**
 * requireMember for pages: no session redirects to sign-in, another railway is a 404 page, and a
 * lower role gets `{ denied }` so the page can say what the role allows instead.
 */
export async function memberForPage(
  railwayId: string,
  minimumRole: Role,
  returnTo: string,
): Promise<{ member: Member; denied?: undefined } | { member?: undefined; denied: true }> {
  try {
    return { member: await requireMember(railwayId, minimumRole) };
  } catch (error) {
    if (error instanceof AppError && error.status === 401) {
      redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
    }
    if (error instanceof AppError && error.status === 403) return { denied: true };
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  }
}
