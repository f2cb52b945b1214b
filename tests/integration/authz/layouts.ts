import type { AuthzCase, AuthzExemption } from './shared';

export const LAYOUT_CASES: AuthzCase[] = [];
export const LAYOUT_EXEMPTIONS: AuthzExemption[] = [];
