import { z } from 'zod';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireLayoutById } from '@/lib/auth/layouts';
import { exportLayoutPlan } from '@/lib/layouts/plan-io';

const paramsSchema = z.object({ layoutId: z.string().min(1).max(100) });

/** Any member: the layout as the engine's plan interchange (JSON, version 1), without runs. */
const downloadPlan = handler<{ layoutId: string }>(async (_request, { params }) => {
  const { layoutId } = parseOrThrow(paramsSchema, await params);
  const { layout } = await requireLayoutById(layoutId, 'operator');
  const file = `${layout.name.replace(/[^\w-]+/g, '-').replace(/^-|-$/g, '') || 'layout'}-plan.json`;
  return new Response(JSON.stringify(exportLayoutPlan(loadLayoutRows(layout.id)), null, 2), {
    headers: {
      'Content-Type': 'application/json; charset=utf-8',
      'Content-Disposition': `attachment; filename="${file}"`,
      'Cache-Control': 'private, no-store',
    },
  });
});

export { downloadPlan as GET };
