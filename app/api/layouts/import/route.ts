import { insertLayoutFromImport } from '@/db/queries/layout-import';
import { recordAudit } from '@/db/queries/railways';
import { requireMember, requireUser } from '@/lib/auth';
import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { revalidateLayout } from '@/lib/layouts/layout-edits';
import { planToImport } from '@/lib/layouts/plan-io';
import { LAYOUT_IMPORT_MAX_BYTES, planImportSchema } from './schema';

/**
 * Planner or host: a plan interchange file (version 1) becomes a new layout, all of it in one
 * transaction or nothing. Runs in the file are left out (a layout holds no timetable).
 */
const importLayoutPlan = handler(async (request) => {
  // Signed in before a byte of the body is read (up to 2 MB, counted as it streams in).
  await requireUser();
  const body = await readJson(request, LAYOUT_IMPORT_MAX_BYTES);
  const railwayId = typeof body === 'object' && body !== null && 'railwayId' in body ? String(body.railwayId) : '';
  // Who is asking comes before what they sent, so an operator learns nothing from a 400.
  const member = await requireMember(railwayId, 'planner', 'import layouts');
  const input = parseOrThrow(planImportSchema, body);
  const { data, skippedRuns } = planToImport(input.plan, input.name);
  const layout = insertLayoutFromImport(member.railwayId, data);
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'import-plan', entity: 'layout', entityId: layout.id, detail: { skippedRuns } });
  revalidateLayout(member.railwayId);
  return Response.json(
    {
      id: layout.id,
      name: layout.name,
      message: `Layout “${layout.name}” imported.${skippedRuns ? ` ${skippedRuns} run${skippedRuns === 1 ? ' was' : 's were'} left out: a layout holds no timetable.` : ''}`,
    },
    { status: 201 },
  );
});

export { importLayoutPlan as POST };
