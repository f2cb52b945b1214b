import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { snapshotOf } from '@/lib/sessions/builder';
import { requireSession } from '@/lib/sessions/access';
import { sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/** The engine's findings and load profile for the stored session. */
const getCheck = handler<{ sessionId: string }>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'view');
  const { findings, counts, totals, truncated, load, checkMs, runs } = snapshotOf(session.id);
  const { errors, warnings } = totals;
  return Response.json({
    sessionId: session.id,
    runCount: runs.length,
    errors,
    warnings,
    counts,
    truncated,
    findings,
    load,
    checkMs,
  });
});

export { getCheck as GET };
