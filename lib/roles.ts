import { ROLES, type Role } from '@/db/enums';

export { ROLES, type Role };

const RANK: Record<Role, number> = { operator: 0, planner: 1, host: 2 };

/** True when `role` may do what `minimum` may: host > planner > operator. */
export function roleAtLeast(role: Role, minimum: Role): boolean {
  return RANK[role] >= RANK[minimum];
}

export const ROLE_LABELS: Record<Role, string> = {
  host: 'Host',
  planner: 'Planner',
  operator: 'Operator',
};

export const ROLE_SUMMARIES: Record<Role, string> = {
  host: 'Everything, including members, roles and sending invitations.',
  planner: 'Layouts, power, rolling stock and timetables.',
  operator: 'Their own runs, published timetables of sessions they are invited to, and replies.',
};
