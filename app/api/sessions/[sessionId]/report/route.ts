import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { buildSessionReport, reportCsv } from '@/lib/live/report';
import { requireSession } from '@/lib/auth/sessions';
import { reportQuerySchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/** The report after the session (JSON; `?format=csv` for the run table; `?punctualMin=N` overrides the setting). */
const report = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'view');
  const query = parseOrThrow(reportQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const built = buildSessionReport(session.id, query.punctualMin);
  if (query.format === 'csv') {
    const name = session.title.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'session';
    return new Response(reportCsv(built), {
      headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${name}-report.csv"` },
    });
  }
  return Response.json(built);
});

export { report as GET };
