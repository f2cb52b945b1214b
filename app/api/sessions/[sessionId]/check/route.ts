import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { loadSessionPlan, snapshotOf } from '@/lib/sessions/builder';
import { storedCheck } from '@/lib/sessions/stored-check';
import { requireSession } from '@/lib/sessions/access';
import { sessionParamsSchema } from './schema';

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
 */
const getCheck = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'view');
  const loaded = loadSessionPlan(session.id);
  const etag = `"${storedCheck(loaded.plan).tag}"`;
  const headers = { ETag: etag, 'Cache-Control': 'private, no-cache' };
  if (matches(request.headers.get('if-none-match'), etag)) return new Response(null, { status: 304, headers });
  const { findings, counts, totals, truncated, load, checkMs, runs } = snapshotOf(session.id, loaded);
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
      load,
      checkMs,
    },
    { headers },
  );
});

export { getCheck as GET };
