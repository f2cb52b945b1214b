import { FOUNDATION_HOSTILE } from './foundation';
import { INVITATION_HOSTILE } from './invitations';
import { LAYOUT_HOSTILE } from './layouts';
import { LIVE_HOSTILE } from './live';
import { SESSION_HOSTILE } from './sessions';
import type { HostileTarget } from './shared';

// Every mutating route handler and server action, by feature.
export const HOSTILE_TARGETS: HostileTarget[] = [...FOUNDATION_HOSTILE, ...LAYOUT_HOSTILE, ...SESSION_HOSTILE, ...INVITATION_HOSTILE, ...LIVE_HOSTILE];
