import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { chartLoad, loadSessionPlan, snapshotOf } from '@/lib/sessions/timetable';
import { compactLoad } from '@/lib/sessions/compact';
import { storedCheck } from '@/lib/sessions/stored-check';
import { requireSession } from '@/lib/auth/sessions';
import { checkQuerySchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/** True when the request's If-None-Match names this entity tag (RFC 9110 13.1.2: a list, or *). */
function matches(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  return ifNoneMatch.split(',').some((t) => {
    const tag = t.trim().replace(/^W\//, '');
    return tag === '*' || tag === etag;
  });
}

/**
 * The engine's findings and load profile for the stored session. The check is kept per state of the
 * plan, and the answer carries that state as its ETag: a client that has it gets 304 Not Modified.
 * `?only=load` answers the load profile alone, each series by id (its name is in the layout), for the
 * builder's Load view, which asks for it when it is opened and after each change.
 */
const getCheck = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { only } = parseOrThrow(checkQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const { session } = await requireSession(sessionId, 'view');
  const loaded = loadSessionPlan(session.id);
  const { tag, check } = storedCheck(loaded.plan);
  const etag = only ? `"${tag}-${only}"` : `"${tag}"`;
  const headers = { ETag: etag, 'Cache-Control': 'private, no-cache' };
  if (matches(request.headers.get('if-none-match'), etag)) return new Response(null, { status: 304, headers });
  if (only === 'load') return Response.json({ sessionId: session.id, load: compactLoad(chartLoad(check.load)) }, { headers });
  const { findings, counts, totals, truncated, checkMs, runs } = snapshotOf(session.id, loaded);
  const { errors, warnings } = totals;
  return Response.json(
    {
      sessionId: session.id,
      runCount: runs.length,
      errors,
      warnings,
      counts,
      truncated,
      findings,
      load: chartLoad(check.load),
      checkMs,
    },
    { headers },
  );
});

export { getCheck as GET };
