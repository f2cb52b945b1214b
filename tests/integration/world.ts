import { addMember } from '@/db/queries/memberships';
import { insertRailway } from '@/db/queries/railways';
import { insertUser } from '@/db/queries/users';
import type { CurrentUser } from '@/lib/current-user';

export type RoleKey = 'anon' | 'outsider' | 'operator' | 'planner' | 'host';
export const ROLE_KEYS: RoleKey[] = ['anon', 'outsider', 'operator', 'planner', 'host'];

let counter = 0;

function makeUser(label: string): CurrentUser {
  counter += 1;
  const email = `${label}-${counter}@test.example`;
  const user = insertUser({ email, name: `${label} ${counter}`, passwordHash: null });
  return { id: user.id, email: user.email, name: user.name };
}

/**
 * Two railways: ours, with a host, a planner and an operator, and another whose host is the
 * "outsider" — signed in and a member somewhere, but not of ours.
 */
export function makeWorld() {
  const host = makeUser('host');
  const planner = makeUser('planner');
  const operator = makeUser('operator');
  const outsider = makeUser('outsider');
  const railway = insertRailway({ name: 'Test railway', timeZone: 'UTC', hostUserId: host.id });
  addMember(railway.id, planner.id, 'planner');
  addMember(railway.id, operator.id, 'operator');
  const otherRailway = insertRailway({ name: 'Other railway', timeZone: 'UTC', hostUserId: outsider.id });
  const users: Record<RoleKey, CurrentUser | null> = { anon: null, outsider, operator, planner, host };
  return { railway, otherRailway, users, host, planner, operator, outsider, makeUser };
}

export function formData(fields: Record<string, string>): FormData {
  const data = new FormData();
  for (const [k, v] of Object.entries(fields)) data.set(k, v);
  return data;
}

/** Form fields where a field may repeat (a multi-select posts one entry per value). */
export function formFields(fields: Record<string, string | string[]>): FormData {
  const data = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) data.append(k, one);
  return data;
}
