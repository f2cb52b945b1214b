import { sql } from 'drizzle-orm';
import {
  index,
  integer,
  real,
  sqliteTable,
  text,
  uniqueIndex,
  type AnySQLiteColumn,
} from 'drizzle-orm/sqlite-core';
import { CLOCK_ACTIONS, OUTBOX_STATUSES, REPORT_KINDS, REPLY_STATES, ROLES, SESSION_STATUSES, STOP_REASONS } from './enums';

/** Times are stored as Unix milliseconds (UTC) unless a column says otherwise. */
const id = () =>
  text('id')
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());
const createdAt = () =>
  integer('created_at', { mode: 'timestamp_ms' })
    .notNull()
    .$defaultFn(() => new Date());
/** Optimistic-concurrency counter: an edit names the version it saw; a stale one is refused. */
const version = () => integer('version').notNull().default(1);

export * from './enums';

export const users = sqliteTable('users', {
  id: id(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash'),
  emailVerifiedAt: integer('email_verified_at', { mode: 'timestamp_ms' }),
  /** Secret for the personal calendar feed; resetting it stops the old URL at once. */
  /** Raised by a password reset or "sign out everywhere": every session signed before it ends. */
  sessionVersion: integer('session_version').notNull().default(0),
  calendarToken: text('calendar_token')
    .notNull()
    .unique()
    .$defaultFn(() => crypto.randomUUID().replaceAll('-', '')),
  createdAt: createdAt(),
});

/** One-time tokens for sign-in links and password resets. Only a hash of the token is kept. */
export const authTokens = sqliteTable(
  'auth_tokens',
  {
    id: id(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: text('purpose', { enum: ['sign-in', 'reset-password', 'sign-up'] }).notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    /** Sign-up only: the chosen password's hash and name, applied when the address's owner confirms. */
    pendingPasswordHash: text('pending_password_hash'),
    pendingName: text('pending_name'),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    usedAt: integer('used_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('auth_tokens_user_idx').on(t.userId)],
);

/** Sessions ended by signing out before their cookie expired (a replayed cookie finds its id here). */
export const endedSessions = sqliteTable(
  'ended_sessions',
  {
    sessionId: text('session_id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [index('ended_sessions_expires_idx').on(t.expiresAt)],
);

/** A railway is the tenant: a club or a home layout group. */
export const railways = sqliteTable('railways', {
  id: id(),
  name: text('name').notNull(),
  /** IANA time zone used for sessions unless a session names its own. */
  timeZone: text('time_zone').notNull().default('UTC'),
  createdAt: createdAt(),
});

export const memberships = sqliteTable(
  'memberships',
  {
    id: id(),
    railwayId: text('railway_id')
      .notNull()
      .references(() => railways.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: ROLES }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('memberships_railway_user_idx').on(t.railwayId, t.userId),
    index('memberships_user_idx').on(t.userId),
  ],
);

/**
 * A host's offer of membership to an e-mail address. Nothing attaches until the owner of that
 * address, signed in with it verified, accepts; declining or a host withdrawing deletes the row.
 */
export const memberInvitations = sqliteTable(
  'member_invitations',
  {
    id: id(),
    railwayId: text('railway_id')
      .notNull()
      .references(() => railways.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: text('role', { enum: ROLES }).notNull(),
    invitedById: text('invited_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('member_invitations_railway_email_idx').on(t.railwayId, t.email),
    index('member_invitations_email_idx').on(t.email),
  ],
);

export const layouts = sqliteTable(
  'layouts',
  {
    id: id(),
    railwayId: text('railway_id')
      .notNull()
      .references(() => railways.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    scaleName: text('scale_name').notNull(),
    scaleRatio: real('scale_ratio').notNull(),
    setting: text('setting', { enum: ['indoor', 'outdoor'] })
      .notNull()
      .default('indoor'),
    notes: text('notes').notNull().default(''),
    /** Random file name under the uploads folder (never under public/). */
    trackPlanFile: text('track_plan_file'),
    trackPlanType: text('track_plan_type'),
    version: version(),
    createdAt: createdAt(),
  },
  (t) => [index('layouts_railway_idx').on(t.railwayId)],
);

export const blocks = sqliteTable(
  'blocks',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    lengthMm: real('length_mm').notNull(),
    /** Distance of the block's start along the line, for the train graph. */
    positionMm: real('position_mm').notNull().default(0),
    /** Which rail the cab's positive output feeds looking towards the block's `b` end (NEM 631 2.3). */
    positiveRail: text('positive_rail', { enum: ['right', 'left'] })
      .notNull()
      .default('right'),
    /** A reversing section: the block has its own polarity switch. */
    reversingSection: integer('reversing_section', { mode: 'boolean' }).notNull().default(false),
    /** A reversing place: trains may change direction here in the middle of a run. */
    reversingPlace: integer('reversing_place', { mode: 'boolean' }).notNull().default(false),
    version: version(),
  },
  (t) => [
    index('blocks_layout_idx').on(t.layoutId),
    uniqueIndex('blocks_layout_name_idx').on(t.layoutId, t.name),
  ],
);

export const links = sqliteTable(
  'links',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    blockAId: text('block_a_id')
      .notNull()
      .references(() => blocks.id, { onDelete: 'cascade' }),
    blockBId: text('block_b_id')
      .notNull()
      .references(() => blocks.id, { onDelete: 'cascade' }),
    /** The rail joint: this end of block A meets `blockBEnd` of block B. */
    blockAEnd: text('block_a_end', { enum: ['a', 'b'] })
      .notNull()
      .default('b'),
    blockBEnd: text('block_b_end', { enum: ['a', 'b'] })
      .notNull()
      .default('a'),
  },
  (t) => [
    index('links_layout_idx').on(t.layoutId),
    // A balloon loop joins one end of the line to both ends of the loop block: pairs repeat, joints do not.
    uniqueIndex('links_joint_idx').on(t.blockAId, t.blockAEnd, t.blockBId, t.blockBEnd),
  ],
);

export const supplies = sqliteTable(
  'supplies',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    volts: real('volts').notNull(),
    amps: real('amps').notNull(),
    version: version(),
  },
  (t) => [index('supplies_layout_idx').on(t.layoutId)],
);

export const drivers = sqliteTable(
  'drivers',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    supplyId: text('supply_id')
      .notNull()
      .references(() => supplies.id, { onDelete: 'restrict' }),
    name: text('name').notNull(),
    /** Engine preset id, or null for ratings typed in by hand. */
    presetId: text('preset_id'),
    /** Free text a user may type (their own part number); never shown as a preset name. */
    partNumber: text('part_number'),
    channels: integer('channels').notNull(),
    channelAmps: real('channel_amps').notNull(),
    channelPeakAmps: real('channel_peak_amps').notNull(),
    totalAmps: real('total_amps'),
    /** Bridge drop against current, least line: dropVolts + dropOhms × I (see the engine's DropLine). */
    dropVolts: real('drop_volts').notNull(),
    dropOhms: real('drop_ohms').notNull().default(0),
    /** Greatest line (worst case); null: the same as the least line. */
    dropMaxVolts: real('drop_max_volts'),
    dropMaxOhms: real('drop_max_ohms'),
    /** How long the peak rating holds, ms; null: no pulse width given (surges judged against channelAmps). */
    peakPulseMs: real('peak_pulse_ms'),
    /** Package dissipation rating, W; null: heat not checked. */
    packageWatts: real('package_watts'),
    version: version(),
  },
  (t) => [index('drivers_layout_idx').on(t.layoutId)],
);

export const cabs = sqliteTable(
  'cabs',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    driverId: text('driver_id')
      .notNull()
      .references(() => drivers.id, { onDelete: 'restrict' }),
    name: text('name').notNull(),
    channel: integer('channel').notNull(),
    version: version(),
  },
  (t) => [
    index('cabs_layout_idx').on(t.layoutId),
    uniqueIndex('cabs_driver_channel_idx').on(t.driverId, t.channel),
  ],
);

/** A layout's wiring sheet (lib/control's wiringSheetSchema, version 1) as JSON: boards, cab and relay pins. */
export const wiringSheets = sqliteTable('wiring_sheets', {
  layoutId: text('layout_id')
    .primaryKey()
    .references(() => layouts.id, { onDelete: 'cascade' }),
  sheet: text('sheet').notNull(),
  version: version(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
    .notNull()
    .$defaultFn(() => new Date()),
});

export const locomotives = sqliteTable(
  'locomotives',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    runningAmps: real('running_amps').notNull(),
    stallAmps: real('stall_amps').notNull(),
    ratedVolts: real('rated_volts').notNull(),
    /** Calibration: top speed at ratedVolts, and the average voltage below which it does not move (null: not measured). */
    topSpeedKmh: real('top_speed_kmh').notNull(),
    startVolts: real('start_volts'),
    version: version(),
  },
  (t) => [index('locomotives_layout_idx').on(t.layoutId)],
);

export const trains = sqliteTable(
  'trains',
  {
    id: id(),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    lightingAmps: real('lighting_amps').notNull().default(0),
    lengthMm: real('length_mm').notNull(),
    /** Scale km/h per second from a stand; null: the common-practice default for the layout's scale. */
    accelKmhPerS: real('accel_kmh_per_s'),
    /** Scale km/h per second when stopping; null: the common-practice default for the layout's scale. */
    brakingKmhPerS: real('braking_kmh_per_s'),
    version: version(),
  },
  (t) => [index('trains_layout_idx').on(t.layoutId)],
);

/** The consist: which locomotives make up a train, in order. */
export const trainLocomotives = sqliteTable(
  'train_locomotives',
  {
    trainId: text('train_id')
      .notNull()
      .references(() => trains.id, { onDelete: 'cascade' }),
    locomotiveId: text('locomotive_id')
      .notNull()
      .references(() => locomotives.id, { onDelete: 'restrict' }),
    position: integer('position').notNull(),
  },
  (t) => [uniqueIndex('train_locomotives_pk').on(t.trainId, t.position)],
);


export const sessions = sqliteTable(
  'sessions',
  {
    id: id(),
    railwayId: text('railway_id')
      .notNull()
      .references(() => railways.id, { onDelete: 'cascade' }),
    layoutId: text('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'restrict' }),
    title: text('title').notNull(),
    place: text('place').notNull().default(''),
    description: text('description').notNull().default(''),
    startsAt: integer('starts_at', { mode: 'timestamp_ms' }).notNull(),
    endsAt: integer('ends_at', { mode: 'timestamp_ms' }).notNull(),
    timeZone: text('time_zone').notNull(),
    clockRatio: real('clock_ratio').notNull(),
    fastStart: text('fast_start').notNull(),
    headwayS: real('headway_s').notNull(),
    surgeS: real('surge_s').notNull(),
    derate: real('derate').notNull(),
    status: text('status', { enum: SESSION_STATUSES }).notNull().default('draft'),
    /** iCalendar SEQUENCE: raised when date, start, end or status change (RFC 5546 2.1.4). */
    sequence: integer('sequence').notNull().default(0),
    /** Least real seconds a train, cab or operator stands between two runs when delays propagate. */
    standS: real('stand_s').notNull().default(60),
    /** A run departing within this many fast minutes of its time counts as punctual in the report. */
    punctualFastMin: real('punctual_fast_min').notNull().default(3),
    /** The host's reply deadline; a reply after it still counts and is marked late. */
    replyBy: integer('reply_by', { mode: 'timestamp_ms' }),
    version: version(),
    createdAt: createdAt(),
  },
  (t) => [
    index('sessions_railway_idx').on(t.railwayId),
    index('sessions_starts_idx').on(t.startsAt),
  ],
);

export const runs = sqliteTable(
  'runs',
  {
    id: id(),
    sessionId: text('session_id')
      .notNull()
      .references(() => sessions.id, { onDelete: 'cascade' }),
    trainId: text('train_id')
      .notNull()
      .references(() => trains.id, { onDelete: 'restrict' }),
    cabId: text('cab_id')
      .notNull()
      .references(() => cabs.id, { onDelete: 'restrict' }),
    operatorId: text('operator_id').references((): AnySQLiteColumn => users.id, {
      onDelete: 'set null',
    }),
    /** Real seconds from the session's start. */
    departS: real('depart_s').notNull(),
    arriveS: real('arrive_s').notNull(),
    speedKmh: real('speed_kmh'),
    note: text('note').notNull().default(''),
    version: version(),
  },
  (t) => [index('runs_session_idx').on(t.sessionId), index('runs_operator_idx').on(t.operatorId)],
);

export const runSteps = sqliteTable(
  'run_steps',
  {
    id: id(),
    runId: text('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    blockId: text('block_id')
      .notNull()
      .references(() => blocks.id, { onDelete: 'restrict' }),
    enterS: real('enter_s').notNull(),
    exitS: real('exit_s').notNull(),
    /** Direction of travel: in at this end, heading for `toEnd` (null: derived from the links). */
    fromEnd: text('from_end', { enum: ['a', 'b'] }),
    toEnd: text('to_end', { enum: ['a', 'b'] }),
  },
  (t) => [uniqueIndex('run_steps_run_position_idx').on(t.runId, t.position)],
);

/** Who is on a session's crew and with what duty (driving, stand-by, yard, ...). */
export const crewAssignments = sqliteTable(
  'crew_assignments',
  {
    id: id(),
    sessionId: text('session_id')
      .notNull()
      .references(() => sessions.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    duty: text('duty').notNull().default('driver'),
    note: text('note').notNull().default(''),
  },
  (t) => [uniqueIndex('crew_session_user_duty_idx').on(t.sessionId, t.userId, t.duty)],
);


export const invitations = sqliteTable(
  'invitations',
  {
    id: id(),
    sessionId: text('session_id')
      .notNull()
      .references(() => sessions.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    reply: text('rsvp', { enum: REPLY_STATES }).notNull().default('needs-action'),
    respondedAt: integer('responded_at', { mode: 'timestamp_ms' }),
    /** Raised with every reply so that a reply link is usable once per reply change. */
    replyNonce: integer('reply_nonce').notNull().default(0),
    /** The session SEQUENCE last sent to this invitee. */
    sentSequence: integer('sent_sequence'),
    /** What the person was last told (JSON, lib/invitations/changes.ts), to say what changed since. */
    sentSnapshot: text('sent_snapshot'),
    /** The last reminder to reply, and how many were sent. */
    remindedAt: integer('reminded_at', { mode: 'timestamp_ms' }),
    reminderCount: integer('reminder_count').notNull().default(0),
    /** A short note with the reply, for the host and planners only. */
    comment: text('comment').notNull().default(''),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('invitations_session_user_idx').on(t.sessionId, t.userId)],
);


// Columns the session day's tables share: the session and run they belong to, who acted.
const sessionRef = () =>
  text('session_id')
    .notNull()
    .references(() => sessions.id, { onDelete: 'cascade' });
const runRef = () =>
  text('run_id')
    .notNull()
    .references(() => runs.id, { onDelete: 'cascade' });
const byUser = () => text('by_user_id').references(() => users.id, { onDelete: 'set null' });

/**
 * The shared fast clock's record: every start, pause, resume and set, in order. The clock at any
 * moment is folded from these (readSessionClock), so a reload or a server restart resumes it.
 */
export const clockEvents = sqliteTable(
  'clock_events',
  {
    id: id(),
    sessionId: sessionRef(),
    action: text('action', { enum: CLOCK_ACTIONS }).notNull(),
    /** Server wall time of the action. */
    at: integer('at', { mode: 'timestamp_ms' }).notNull(),
    /** Session real seconds the clock reads from (start and set); null for pause and resume. */
    sessionS: real('session_s'),
    byUserId: byUser(),
  },
  (t) => [index('clock_events_session_idx').on(t.sessionId, t.at)],
);

/** What happened to a run during the session: departed, arrived, stopped. A correction is a new row. */
export const runReports = sqliteTable(
  'run_reports',
  {
    id: id(),
    sessionId: sessionRef(),
    runId: runRef(),
    kind: text('kind', { enum: REPORT_KINDS }).notNull(),
    reason: text('reason', { enum: STOP_REASONS }),
    /** Session real seconds on the shared clock when it happened (fast time = fastStart + this × ratio). */
    sessionS: real('session_s').notNull(),
    /** Real wall time the report was made. */
    reportedAt: integer('reported_at', { mode: 'timestamp_ms' }).notNull(),
    /** A correction of an earlier report of the same kind (its time typed, or withdrawn). */
    correction: integer('correction', { mode: 'boolean' }).notNull().default(false),
    withdrawn: integer('withdrawn', { mode: 'boolean' }).notNull().default(false),
    byUserId: byUser(),
  },
  (t) => [index('run_reports_session_idx').on(t.sessionId, t.reportedAt)],
);

/** A repair the host applied during the session: extra real seconds on a run's planned times (never overwrites them). */
export const runRepairs = sqliteTable(
  'run_repairs',
  {
    id: id(),
    sessionId: sessionRef(),
    runId: runRef(),
    delayS: real('delay_s').notNull(),
    appliedAt: integer('applied_at', { mode: 'timestamp_ms' }).notNull(),
    byUserId: byUser(),
  },
  (t) => [index('run_repairs_session_idx').on(t.sessionId)],
);

/** The session day's event log: one numbered row per change, so a reconnecting screen catches up (Last-Event-ID). */
export const liveEvents = sqliteTable(
  'live_events',
  {
    id: id(),
    sessionId: sessionRef(),
    /** 1, 2, 3, … per session, without gaps. */
    seq: integer('seq').notNull(),
    type: text('type').notNull(),
    summary: text('summary').notNull(),
    at: integer('at', { mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [uniqueIndex('live_events_session_seq_idx').on(t.sessionId, t.seq)],
);

/** Every e-mail is written here first; a worker sends it, retrying with backoff. */
export const outbox = sqliteTable(
  'outbox',
  {
    id: id(),
    railwayId: text('railway_id').references(() => railways.id, { onDelete: 'cascade' }),
    invitationId: text('invitation_id').references(() => invitations.id, { onDelete: 'set null' }),
    /** Same key, same message: a second enqueue is ignored, so no one gets it twice. */
    dedupeKey: text('dedupe_key').notNull().unique(),
    kind: text('kind').notNull(),
    toAddress: text('to_address').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html'),
    calendarMethod: text('calendar_method'),
    calendar: text('calendar'),
    status: text('status', { enum: OUTBOX_STATUSES }).notNull().default('queued'),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: integer('next_attempt_at', { mode: 'timestamp_ms' })
      .notNull()
      .$defaultFn(() => new Date()),
    lastError: text('last_error'),
    sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('outbox_status_next_idx').on(t.status, t.nextAttemptAt)],
);

/** Messages caught by the built-in local mail server (only when SMTP_URL is not set). */
export const caughtMail = sqliteTable(
  'caught_mail',
  {
    id: id(),
    /** Message-ID header; the same message delivered twice is kept once. */
    messageId: text('message_id').unique(),
    fromAddress: text('from_address').notNull(),
    toAddresses: text('to_addresses').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull().default(''),
    html: text('html'),
    raw: text('raw').notNull(),
    receivedAt: integer('received_at', { mode: 'timestamp_ms' })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [index('caught_mail_received_idx').on(t.receivedAt)],
);

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: id(),
    railwayId: text('railway_id').references(() => railways.id, { onDelete: 'cascade' }),
    userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    entity: text('entity').notNull(),
    entityId: text('entity_id'),
    detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
    at: integer('at', { mode: 'timestamp_ms' })
      .notNull()
      .default(sql`(unixepoch('subsec') * 1000)`),
  },
  (t) => [index('audit_railway_idx').on(t.railwayId, t.at)],
);

export type User = typeof users.$inferSelect;
export type Railway = typeof railways.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Layout = typeof layouts.$inferSelect;
export type Session = typeof sessions.$inferSelect;
export type ClockEvent = typeof clockEvents.$inferSelect;
export type RunReport = typeof runReports.$inferSelect;
export type RunRepair = typeof runRepairs.$inferSelect;
export type LiveEvent = typeof liveEvents.$inferSelect;
export type OutboxMessage = typeof outbox.$inferSelect;
export type CaughtMail = typeof caughtMail.$inferSelect;
