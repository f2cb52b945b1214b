// Plain value lists shared by the tables and by the code above them (no database imports here,
// so client components can use them through lib/ without pulling in the ORM).
export const ROLES = ['operator', 'planner', 'host'] as const;
export type Role = (typeof ROLES)[number];

export const SESSION_STATUSES = ['draft', 'published', 'cancelled'] as const;
export type SessionStatus = (typeof SESSION_STATUSES)[number];

export const REPLY_STATES = ['needs-action', 'accepted', 'tentative', 'declined'] as const;
export type ReplyState = (typeof REPLY_STATES)[number];

export const OUTBOX_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const;

export const CLOCK_ACTIONS = ['start', 'pause', 'resume', 'set'] as const;
export type ClockAction = (typeof CLOCK_ACTIONS)[number];

export const REPORT_KINDS = ['departed', 'arrived', 'stopped'] as const;
export type ReportKind = (typeof REPORT_KINDS)[number];

/** Why a train stopped and needs help. */
export const STOP_REASONS = ['stalled', 'derailed', 'blocked'] as const;
export type StopReason = (typeof STOP_REASONS)[number];
