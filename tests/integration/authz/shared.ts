import type { ActionState } from '@/lib/errors';
import type { makeWorld, RoleKey } from '../world';

export type World = ReturnType<typeof makeWorld>;
export type Expect = Record<RoleKey, number>;
export type AuthzCase = {
  /** `path/to/file.ts#exportName`, relative to the project root. */
  target: string;
  /** Runs the target as the signed-in user of `role` in a fresh world and returns its status. */
  call: (world: World) => Promise<number>;
  expect: Expect;
};

/** An exempt target: said why, and tested elsewhere. */
export type AuthzExemption = { target: string; why: string };

/** A server action's result as an HTTP-like status (redirects count as 303). */
export async function actionStatus(run: () => Promise<ActionState>): Promise<number> {
  try {
    const state = await run();
    return state?.ok ? 200 : (state?.status ?? 500);
  } catch (error) {
    if (error && typeof error === 'object' && 'digest' in error && String(error.digest).startsWith('NEXT_REDIRECT')) {
      return 303;
    }
    throw error;
  }
}


export const hostOnly: Expect = { anon: 401, outsider: 404, operator: 403, planner: 403, host: 200 };
export const plannerUp: Expect = { anon: 401, outsider: 404, operator: 403, planner: 200, host: 200 };
export const anyMember: Expect = { anon: 401, outsider: 404, operator: 200, planner: 200, host: 200 };
export const signedIn: Expect = { anon: 401, outsider: 303, operator: 303, planner: 303, host: 303 };
export const everyone: Expect = { anon: 200, outsider: 200, operator: 200, planner: 200, host: 200 };
