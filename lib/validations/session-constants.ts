// Session defaults and status moves without zod, so client screens (the builder's publishing panel,
// the session form) can read them without the validation schemas. lib/validations/session.ts re-exports them.
import { SESSION_STATUSES } from '@/db/enums';
import { defaultRules } from '@/lib/planning/rules';

export const SESSION_DEFAULTS = {
  clockRatio: 4,
  fastStart: '06:00',
  headwayS: defaultRules.headwayS,
  surgeS: defaultRules.surgeS,
  deratePercent: Math.round(defaultRules.derate * 100),
  startTime: '18:30',
  endTime: '21:30',
  /** Session day: least real seconds between two runs of one train, cab or operator when delays propagate. */
  standS: 60,
  /** Session day: a departure within this many fast minutes of its time is punctual in the report. */
  punctualFastMin: 3,
} as const;

/** Which status a session may move to from each: draft → published → cancelled, and a cancelled one may be reopened as a draft. */
export const STATUS_MOVES: Record<(typeof SESSION_STATUSES)[number], readonly (typeof SESSION_STATUSES)[number][]> = {
  draft: ['published', 'cancelled'],
  published: ['cancelled'],
  cancelled: ['draft'],
};
