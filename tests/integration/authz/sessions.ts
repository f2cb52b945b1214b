import type { AuthzCase, AuthzExemption } from './shared';

export const SESSION_CASES: AuthzCase[] = [];
export const SESSION_EXEMPTIONS: AuthzExemption[] = [];
