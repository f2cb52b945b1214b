import { loadLayoutRows } from '@/db/queries/plan-data';
import { recordAudit } from '@/db/queries/railways';
import { AppError, parseOrThrow, readText } from '@/lib/errors';
import { handler } from '@/lib/http';
import { commitCsvImport, exportCsv, planCsvImport } from '@/lib/layouts/csv-import';
import { requireLayoutById } from '@/lib/auth/layouts';
import { revalidateLayout } from '@/lib/layouts/layout-edits';
import { CSV_MAX_BYTES } from '@/lib/validations/layout';
import { csvImportQuerySchema, csvParamsSchema } from './schema';

type Params = { layoutId: string; table: string };

/** Any member: one table of the layout as CSV, in the form the import reads back. */
const exportTable = handler<Params>(async (_request, { params }) => {
  const { layoutId, table } = parseOrThrow(csvParamsSchema, await params);
  const { layout } = await requireLayoutById(layoutId, 'operator');
  const csv = exportCsv(table, loadLayoutRows(layout.id));
  const file = `${layout.name.replace(/[^\w-]+/g, '-').replace(/^-|-$/g, '') || 'layout'}-${table}.csv`;
  return new Response(csv, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${file}"`,
      'Cache-Control': 'private, no-store',
    },
  });
});

/**
 * Planner or host: imports one table from CSV (the request body). `mode=preview` answers every
 * row's outcome and every problem by row and column, writing nothing; `mode=commit` writes all rows
 * in one transaction, or nothing if any row is wrong (400) or the table changed since the preview (409).
 */
const importTable = handler<Params>(async (request, { params }) => {
  const { layoutId, table } = parseOrThrow(csvParamsSchema, await params);
  const { member, layout } = await requireLayoutById(layoutId, 'planner', 'import into layouts');
  const query = parseOrThrow(csvImportQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const text = await readText(request, {
    maxBytes: CSV_MAX_BYTES,
    accepted: ['text/csv'],
    wrongType: 'Send the table as CSV (Content-Type: text/csv).',
    tooLarge: () => new AppError('too_large', 'The file is over 1 MB; the limit is 1 MB. Split it into smaller files.'),
  });
  const rows = loadLayoutRows(layout.id);
  if (query.mode === 'preview') return Response.json(planCsvImport(table, text, rows).preview);
  const done = commitCsvImport(layout.id, table, text, query.basis, rows);
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'import-csv', entity: table, entityId: layout.id, detail: done.counts });
  revalidateLayout(member.railwayId, layout.id);
  return Response.json(done);
});

export { exportTable as GET, importTable as POST };
