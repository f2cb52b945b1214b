// Every route handler and server action, by feature. A feature adds its own file here.
import { FOUNDATION_CASES, FOUNDATION_EXEMPTIONS } from './foundation';
import { INVITATION_CASES, INVITATION_EXEMPTIONS } from './invitations';
import { LAYOUT_CASES, LAYOUT_EXEMPTIONS } from './layouts';
import { LIVE_CASES, LIVE_EXEMPTIONS } from './live';
import { SESSION_CASES, SESSION_EXEMPTIONS } from './sessions';
import type { AuthzCase, AuthzExemption } from './shared';

export const AUTHZ_CASES: AuthzCase[] = [...FOUNDATION_CASES, ...LAYOUT_CASES, ...SESSION_CASES, ...INVITATION_CASES, ...LIVE_CASES];
export const AUTHZ_EXEMPTIONS: AuthzExemption[] = [
  ...FOUNDATION_EXEMPTIONS,
  ...LAYOUT_EXEMPTIONS,
  ...SESSION_EXEMPTIONS,
  ...INVITATION_EXEMPTIONS,
  ...LIVE_EXEMPTIONS,
];
