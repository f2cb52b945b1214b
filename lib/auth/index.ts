import 'server-only';
// Who is asking, and what they may see or change. The rules live in this folder and nowhere else:
// railway membership and roles here; pages (pages.ts: redirects and 404 pages); sessions (sessions.ts,
// with the operator-visibility rule); layouts (layouts.ts).
import { getMembership } from '@/db/queries/memberships';
import type { Role } from '@/db/schema';
import { currentUser, type CurrentUser } from '@/lib/current-user';
import { forbidden, notFound, unauthorized } from '@/lib/errors';
import { roleAtLeast } from '@/lib/roles';

export { currentUser as auth };

export type Member = { user: CurrentUser; railwayId: string; role: Role };

/** The signed-in user, or a 401. */
export async function requireUser(): Promise<CurrentUser> {
  const user = await currentUser();
  if (!user) throw unauthorized();
  return user;
}

/**
 * The one gate for railway data. No session: 401. Not a member of this railway: 404, so that
 * another railway's ids reveal nothing. A member below `minimumRole`: 403.
 */
export async function requireMember(
  railwayId: string,
  minimumRole: Role,
  what?: string,
): Promise<Member> {
  const user = await requireUser();
  const membership = getMembership(railwayId, user.id);
  if (!membership) throw notFound('That railway');
  if (!roleAtLeast(membership.role, minimumRole)) throw forbidden(what);
  return { user, railwayId, role: membership.role };
}
