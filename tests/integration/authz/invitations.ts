import type { AuthzCase, AuthzExemption } from './shared';

export const INVITATION_CASES: AuthzCase[] = [];
export const INVITATION_EXEMPTIONS: AuthzExemption[] = [];
