import 'server-only';
import { notFound } from 'next/navigation';
import { getLayout } from '@/db/queries/layouts';
import type { loadLayoutRows } from '@/db/queries/plan-data';
import { memberForPage } from '@/lib/auth/pages';
import { roleAtLeast } from '@/lib/roles';
import type { BudgetInput } from '@/lib/layouts/power-budget';

/** A layout page's gate: any member reads; planners and hosts edit; another railway's layout is a 404 page. */
export async function layoutForPage(railwayId: string, layoutId: string, path = '') {
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/layouts/${layoutId}${path}`);
  if (!member) notFound();
  const layout = getLayout(railwayId, layoutId);
  if (!layout) notFound();
  return { member, layout, canEdit: roleAtLeast(member.role, 'planner') };
}

/** The rows the power budget and duty tables read. */
export function budgetInputOf(rows: ReturnType<typeof loadLayoutRows>): BudgetInput {
  const consist = new Map<string, string[]>();
  for (const c of rows.consists) consist.set(c.trainId, [...(consist.get(c.trainId) ?? []), c.locomotiveId]);
  return {
    scale: { name: rows.layout?.scaleName ?? '', ratio: rows.layout?.scaleRatio ?? 1 },
    supplies: rows.supplies,
    drivers: rows.drivers,
    cabs: rows.cabs,
    locomotives: rows.locomotives,
    trains: rows.trains.map((t) => ({ ...t, locomotiveIds: consist.get(t.id) ?? [] })),
  };
}
