import { FOUNDATION_HOSTILE } from './foundation';
import type { HostileTarget } from './shared';

// Every mutating route handler and server action, by feature.
export const HOSTILE_TARGETS: HostileTarget[] = [...FOUNDATION_HOSTILE];
