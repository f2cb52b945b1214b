// Plain value lists shared by the tables and by the code above them (no database imports here,
// so client components can use them through lib/ without pulling in the ORM).
export const ROLES = ['operator', 'planner', 'host'] as const;
export type Role = (typeof ROLES)[number];

export const SESSION_STATUSES = ['draft', 'published', 'cancelled'] as const;
export type SessionStatus = (typeof SESSION_STATUSES)[number];

export const RSVP_STATES = ['needs-action', 'accepted', 'tentative', 'declined'] as const;
export type RsvpState = (typeof RSVP_STATES)[number];

export const OUTBOX_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const;
