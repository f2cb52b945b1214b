import type { CurrentUser } from '@/lib/current-user';

/** The signed-in user the next call runs as (null: nobody signed in). */
export const caller: { user: CurrentUser | null } = { user: null };

export function signInAs(user: CurrentUser | null): void {
  caller.user = user;
}
