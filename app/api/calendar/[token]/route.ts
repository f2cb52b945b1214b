import { z } from 'zod';
import { getUserByCalendarToken } from '@/db/queries/calendar-feed';
import { personalFeed } from '@/lib/calendar/feeds';
import { notFound, parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';

export const dynamic = 'force-dynamic';

// Calendar apps add ".ics" to subscription URLs at times; accept it.
const tokenSchema = z
  .string()
  .transform((t) => t.replace(/\.ics$/, ''))
  .pipe(z.string().regex(/^[A-Za-z0-9_-]{16,100}$/, 'That is not a calendar feed address.'));

/**
 * A person's calendar feed, addressed by the secret token in the URL (calendar apps cannot sign
 * in). The same answer whoever asks; a reset token matches no one, so the old URL is a 404 at once.
 */
const getPersonalFeed = handler<{ token: string }>(async (_request, { params }) => {
  const token = parseOrThrow(tokenSchema, (await params).token);
  const user = getUserByCalendarToken(token);
  if (!user) throw notFound('That calendar feed');
  return new Response(personalFeed(user), {
    headers: {
      'Content-Type': 'text/calendar; charset=utf-8',
      'Content-Disposition': 'inline; filename="fishplate.ics"',
      'Cache-Control': 'private, no-store',
    },
  });
});

export { getPersonalFeed as GET };
