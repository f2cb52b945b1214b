import { z } from 'zod';
import { CLOCK_ACTIONS, REPORT_KINDS, STOP_REASONS } from '@/db/enums';
import { timeOfDaySchema } from '@/lib/planning';
import { SESSION_DAY_RANGE } from '@/lib/validations/session';

const fastTime = timeOfDaySchema({ missing: 'Enter a fast-clock time as HH:MM.', invalid: 'Enter the fast-clock time as HH:MM, e.g. 06:45.' });

/** `POST /api/sessions/{id}/clock`: start (optionally from a fast time), pause, resume, or set to a fast time. */
export const clockActionSchema = z
  .strictObject({
    action: z.enum(CLOCK_ACTIONS, { error: 'Choose start, pause, resume or set.' }),
    fast: fastTime.optional(),
  })
  .refine((v) => v.action !== 'set' || v.fast !== undefined, { message: 'Say which fast time to set the clock to.', path: ['fast'] })
  .refine((v) => v.fast === undefined || v.action === 'start' || v.action === 'set', {
    message: 'Only start and set take a fast time.',
    path: ['fast'],
  });
export type ClockActionInput = z.infer<typeof clockActionSchema>;

/**
 * `POST /api/sessions/{id}/runs/{runId}/reports`. A report is made now on the shared clock; `fast`
 * corrects the time of the run's report of that kind, `withdraw` takes it back (both: the run's
 * operator or the host).
 */
export const reportSchema = z
  .strictObject({
    kind: z.enum(REPORT_KINDS, { error: 'Choose departed, arrived or stopped.' }),
    reason: z.enum(STOP_REASONS, { error: 'Choose stalled, derailed or blocked.' }).optional(),
    fast: fastTime.optional(),
    withdraw: z.literal(true).optional(),
  })
  .refine((v) => v.kind === 'stopped' || v.reason === undefined, { message: 'Only a stop has a reason.', path: ['reason'] })
  .refine((v) => v.kind !== 'stopped' || v.withdraw === true || v.reason !== undefined, {
    message: 'Say why the train stopped: stalled, derailed or blocked.',
    path: ['reason'],
  })
  .refine((v) => !(v.withdraw && v.fast !== undefined), { message: 'Withdraw a report or correct its time, not both.', path: ['fast'] });
export type ReportInput = z.infer<typeof reportSchema>;

/** The host's repair: the moves it saw proposed (so a proposal that changed meanwhile is refused, 409). */
export const repairSchema = z.strictObject({
  moves: z
    .array(
      z.strictObject({
        runId: z.string().trim().min(1).max(100),
        delayS: z.number().positive('A repair only moves a run later.').max(86_400, 'That is more than a day.'),
      }),
    )
    .min(1, 'Nothing to repair.')
    .max(2000, 'At most 2000 runs at once.'),
});
export type RepairInput = z.infer<typeof repairSchema>;

/** `GET /api/sessions/{id}/live` without a stream: events after `after` (polling). */
export const livePollSchema = z.object({
  after: z.coerce.number().int().min(0).max(Number.MAX_SAFE_INTEGER).default(0),
});

/** `GET /api/sessions/{id}/report`. */
export const reportQuerySchema = z.object({
  format: z.enum(['json', 'csv']).default('json'),
  punctualMin: z.coerce.number().min(SESSION_DAY_RANGE.punctualFastMin.min).max(SESSION_DAY_RANGE.punctualFastMin.max).optional(),
});
