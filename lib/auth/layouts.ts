import 'server-only';
import { z } from 'zod';
import { getLayout, getLayoutRailwayId } from '@/db/queries/layouts';
import type { Layout, Role } from '@/db/schema';
import { requireMember, requireUser, type Member } from '@/lib/auth';
import { AppError, notFound, parseOrThrow } from '@/lib/errors';

export type LayoutContext = { member: Member; layout: Layout };

const idSchema = z.string().min(1).max(100);

/**
 * The gate for everything inside a layout: the caller's role on the railway (401/404/403), then
 * the layout looked up within that railway, so another railway's layout id is a 404.
 */
export async function requireLayout(railwayId: string, layoutId: string, minimumRole: Role, what?: string): Promise<LayoutContext> {
  const member = await requireMember(parseOrThrow(idSchema, railwayId), minimumRole, what);
  const layout = getLayout(member.railwayId, parseOrThrow(idSchema, layoutId));
  if (!layout) throw notFound('That layout');
  return { member, layout };
}

/**
 * For route handlers, which name a layout without its railway: 401 without a session, 404 for a
 * layout that does not exist or whose railway the caller is not a member of, 403 below `minimumRole`.
 */
export async function requireLayoutById(layoutId: string, minimumRole: Role, what?: string): Promise<LayoutContext> {
  await requireUser();
  const railwayId = getLayoutRailwayId(parseOrThrow(idSchema, layoutId));
  if (!railwayId) throw notFound('That layout');
  try {
    return await requireLayout(railwayId, layoutId, minimumRole, what);
  } catch (error) {
    // Another railway's layout answers as an unknown id does, so its ids reveal nothing.
    if (error instanceof AppError && error.status === 404) throw notFound('That layout');
    throw error;
  }
}
