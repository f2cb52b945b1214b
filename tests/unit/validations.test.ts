import { describe, expect, it } from 'vitest';
import { changeRoleSchema, emailSchema, railwaySchema, resetPasswordSchema, signInSchema, signUpSchema } from '@/lib/validations/account';
import { guestEmailsSchema, inviteCrewSchema, replyByTokenSchema } from '@/lib/validations/invitation';
import {
  blockEditSchema,
  blockSchema,
  driverSchema,
  formToObject,
  layoutSchema,
  linkSchema,
  locomotiveName,
  locomotiveSchema,
  scaleIdOf,
  supplySchema,
  trainSchema,
} from '@/lib/validations/layout';
import { clockActionSchema, livePollSchema, repairSchema, reportQuerySchema, reportSchema } from '@/lib/validations/live';
import { createRunSchema, retimeMovesSchema, updateRunSchema } from '@/lib/runs/schema';
import { duplicateSessionSchema, sessionSettingsSchema, sessionStatusSchema } from '@/lib/validations/session';

// Each refusal here has exactly one bad field in an otherwise valid input, and names that field alone
// (the limits themselves are probed against the tests' own table in validation-bounds.test.ts).

type Issue = { path: PropertyKey[]; message: string };
type Schema = { safeParse: (v: unknown) => { success: boolean; data?: unknown; error?: { issues: Issue[] } } };

/** The parsed value of a valid input (fails the test with the issues when it is refused). */
function parsed<T>(schema: { safeParse: (v: unknown) => { data?: T; error?: { issues: Issue[] } } }, input: unknown): T {
  const result = schema.safeParse(input);
  expect(result.error?.issues ?? [], JSON.stringify(input)).toEqual([]);
  return result.data as T;
}

/** The one issue a refused input gets; it must be on `field`. */
function refusedOn(schema: Schema, input: unknown, field: string): string {
  const result = schema.safeParse(input);
  expect(result.success, JSON.stringify(input)).toBe(false);
  const issues = result.error!.issues;
  expect(issues.map((i) => i.path.join('.')), JSON.stringify(input)).toEqual([field]);
  return issues[0]!.message;
}

// A message the form shows beside the field: a sentence, not empty (common practice for form errors).
const SENTENCE = /^[A-Z].*\S[.)]$/;

describe('layout numbers typed as text', () => {
  const supply = { name: 'Main supply', volts: '15', amps: '3' };

  it('reads plain, signed, decimal-comma, leading-point and exponent forms, with spaces around', () => {
    expect(parsed(supplySchema, { ...supply, volts: ' 12 ' }).volts).toBe(12);
    expect(parsed(supplySchema, { ...supply, volts: '12,5' }).volts).toBe(12.5);
    expect(parsed(supplySchema, { ...supply, volts: '.5' }).volts).toBe(0.5);
    expect(parsed(supplySchema, { ...supply, volts: '+1.2e1' }).volts).toBe(12);
    expect(parsed(supplySchema, { ...supply, volts: 9 }).volts).toBe(9);
  });

  it('a blank or missing number asks for one; text that is not a number shows an example', () => {
    for (const volts of ['', '  ', null, undefined]) expect(refusedOn(supplySchema, { ...supply, volts }, 'volts')).toBe('Enter a number.');
    for (const volts of ['12 V', '1.2.3', 'e5', true]) {
      expect(refusedOn(supplySchema, { ...supply, volts }, 'volts')).toBe('Enter a number, like 12 or 0.5.');
    }
  });

  it('a refused limit names the limit and its unit', () => {
    expect(refusedOn(supplySchema, { ...supply, volts: '61' }, 'volts')).toBe('Must be 60 V or less.');
    expect(refusedOn(supplySchema, { ...supply, amps: '0' }, 'amps')).toBe('Must be more than 0 A.');
    expect(refusedOn(locomotiveSchema, { name: 'Tank', runningAmps: '-1', stallAmps: '1', ratedVolts: '12', topSpeedKmh: '60' }, 'runningAmps')).toBe(
      'Must be 0 A or more.',
    );
  });

  it('names are trimmed, read from numbers too, and a blank one is refused', () => {
    expect(parsed(supplySchema, { ...supply, name: '  Main supply ' }).name).toBe('Main supply');
    expect(parsed(supplySchema, { ...supply, name: 42 }).name).toBe('42');
    expect(refusedOn(supplySchema, { ...supply, name: null }, 'name')).toBe('Enter a name.');
    expect(refusedOn(supplySchema, { volts: '15', amps: '3' }, 'name')).toBe('Enter a name.');
    expect(refusedOn(supplySchema, { ...supply, name: ' ' }, 'name')).toBe('Enter a name.');
  });

  it('a locomotive name may not hold the CSV consist separator', () => {
    expect(locomotiveName.safeParse('Tank; engine').success).toBe(false);
    expect(locomotiveName.safeParse('Tank, engine').success).toBe(true);
  });
});

describe('layout and scale', () => {
  const layout = { name: 'Branch line', scaleId: 'h0-nem', customScaleName: '', customRatio: '', setting: 'indoor', notes: '' };

  it('a table scale stores its label and ratio (NEM 010 Table 1: H0 1:87)', () => {
    expect(parsed(layoutSchema, layout)).toEqual({ name: 'Branch line', scaleName: 'H0 (NEM)', scaleRatio: 87, setting: 'indoor', notes: '' });
  });

  it('an own scale needs its name and a ratio from 1 to 1000', () => {
    const own = { ...layout, scaleId: 'custom', customScaleName: 'Garden', customRatio: '24' };
    expect(parsed(layoutSchema, own)).toMatchObject({ scaleName: 'Garden', scaleRatio: 24 });
    expect(parsed(layoutSchema, { ...own, customRatio: '1000' }).scaleRatio).toBe(1000);
    expect(parsed(layoutSchema, { ...own, customRatio: '1' }).scaleRatio).toBe(1);
    expect(refusedOn(layoutSchema, { ...own, customScaleName: '' }, 'customScaleName')).toBe('Name your scale.');
    expect(refusedOn(layoutSchema, { ...own, customRatio: '' }, 'customRatio')).toBe('Enter the ratio, e.g. 87 for 1:87.');
    expect(refusedOn(layoutSchema, { ...own, customRatio: '1001' }, 'customRatio')).toMatch(/1000/);
    expect(refusedOn(layoutSchema, { ...own, customRatio: '0.5' }, 'customRatio')).toMatch(/1000/);
    // A table scale ignores the own-scale fields.
    expect(parsed(layoutSchema, { ...layout, customRatio: '5000' }).scaleRatio).toBe(87);
  });

  it('a stored layout finds its table row by label, or by name and ratio together, else it is custom', () => {
    expect(scaleIdOf({ scaleName: 'H0 (NEM)', scaleRatio: 87 })).toBe('h0-nem');
    expect(scaleIdOf({ scaleName: 'H0', scaleRatio: 87 })).toBe('h0-nem');
    expect(scaleIdOf({ scaleName: 'H0', scaleRatio: 90 })).toBe('custom');
    expect(scaleIdOf({ scaleName: 'Garden', scaleRatio: 87 })).toBe('custom');
  });
});

describe('blocks, links and trains', () => {
  const block = { name: 'Up main', length: '120', position: '', unit: 'cm' };

  it('lengths are stored in mm; the unit may be typed in capitals with spaces; a blank position is 0', () => {
    expect(parsed(blockSchema, block)).toEqual({ name: 'Up main', lengthMm: 1200, positionMm: 0 });
    expect(parsed(blockSchema, { ...block, unit: ' CM ' }).lengthMm).toBe(1200);
    expect(parsed(blockSchema, { ...block, position: null }).positionMm).toBe(0);
    expect(parsed(blockSchema, { ...block, position: '2,5' }).positionMm).toBe(25);
    expect(refusedOn(blockSchema, { ...block, unit: 'yd' }, 'unit')).toMatch(/mm, cm, m, in, ft/);
    expect(refusedOn(blockSchema, { ...block, unit: 10 }, 'unit')).toMatch(/mm, cm, m, in, ft/);
  });

  it('at most 1 km of track after conversion to mm (common practice: far above any layout)', () => {
    expect(parsed(blockSchema, { ...block, length: '1000', unit: 'm' }).lengthMm).toBe(1_000_000);
    expect(refusedOn(blockSchema, { ...block, length: '1000.5', unit: 'm' }, 'length')).toMatch(/1 000 m/);
    expect(refusedOn(trainSchema, { name: 'Goods', locomotiveIds: ['l1'], length: '3281', unit: 'ft' }, 'length')).toMatch(/1 000 m/);
  });

  it('a length that rounds to 0 mm (stored to 0.001 mm) is refused', () => {
    expect(refusedOn(blockSchema, { ...block, length: '0.0001', unit: 'mm' }, 'length')).toBe('Must be more than 0.');
    expect(parsed(blockSchema, { ...block, length: '0.001', unit: 'mm' }).lengthMm).toBe(0.001);
  });

  it('an edit keeps its id and version', () => {
    expect(parsed(blockEditSchema, { ...block, id: 'b1', version: '3' })).toMatchObject({ id: 'b1', version: 3, lengthMm: 1200 });
    expect(refusedOn(blockEditSchema, { ...block, id: 'b1', version: '0' }, 'version')).toBeTruthy();
  });

  it('a block cannot link to itself', () => {
    expect(refusedOn(linkSchema, { blockAId: 'a', blockBId: 'a' }, 'blockBId')).toMatch(SENTENCE);
    // Without ends a link joins A's b end to B's a end (the upgrade's default along the line).
    expect(parsed(linkSchema, { blockAId: 'a', blockBId: 'b' })).toEqual({ blockAId: 'a', blockBId: 'b', blockAEnd: 'b', blockBEnd: 'a' });
    expect(parsed(linkSchema, { blockAId: 'a', blockBId: 'b', blockAEnd: 'a', blockBEnd: 'a' })).toMatchObject({ blockAEnd: 'a', blockBEnd: 'a' });
  });

  it('a train: one locomotive id from a form, a consist once each, lighting blank is 0', () => {
    const train = { name: 'Goods', locomotiveIds: 'l1', lightingAmps: '', length: '50', unit: 'cm' };
    // Ramps left blank: null, so the scale's common-practice figures apply (defaultRamps).
    expect(parsed(trainSchema, train)).toEqual({ name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 500, accelKmhPerS: null, brakingKmhPerS: null });
    expect(parsed(trainSchema, { ...train, accelKmhPerS: '12,5', brakingKmhPerS: '20' })).toMatchObject({ accelKmhPerS: 12.5, brakingKmhPerS: 20 });
    expect(refusedOn(trainSchema, { ...train, accelKmhPerS: '0' }, 'accelKmhPerS')).toMatch(SENTENCE);
    expect(refusedOn(trainSchema, { ...train, brakingKmhPerS: '101' }, 'brakingKmhPerS')).toMatch(SENTENCE);
    expect(parsed(trainSchema, { ...train, locomotiveIds: ['l1', 'l2'], lightingAmps: '0.2' })).toMatchObject({ locomotiveIds: ['l1', 'l2'], lightingAmps: 0.2 });
    expect(refusedOn(trainSchema, { ...train, locomotiveIds: ['l1', 'l1'] }, 'locomotiveIds')).toMatch(SENTENCE);
    expect(refusedOn(trainSchema, { ...train, locomotiveIds: '' }, 'locomotiveIds')).toMatch(SENTENCE);
    expect(refusedOn(trainSchema, { ...train, locomotiveIds: 5 }, 'locomotiveIds')).toBe('A train needs at least one locomotive.');
  });
});

describe('drivers and locomotives: ratings that must agree', () => {
  const driver = {
    name: 'Bridge A',
    supplyId: 's1',
    presetId: '',
    partNumber: '',
    channels: '2',
    channelAmps: '1',
    channelPeakAmps: '2',
    totalAmps: '',
    dropVolts: '1.4',
    dropOhms: '',
    dropMaxVolts: '',
    dropMaxOhms: '',
    peakPulseMs: '',
    packageWatts: '',
  };

  it('blank optional ratings are none; a preset id and a part number are kept, trimmed', () => {
    expect(parsed(driverSchema, driver)).toMatchObject({ presetId: null, partNumber: null, totalAmps: null, dropOhms: 0, dropMaxVolts: null, dropMaxOhms: null });
    expect(parsed(driverSchema, { ...driver, presetId: 'bipolar-quad-half-h-1a', partNumber: ' QH-1 ' })).toMatchObject({
      presetId: 'bipolar-quad-half-h-1a',
      partNumber: 'QH-1',
    });
    expect(parsed(driverSchema, { ...driver, partNumber: '   ' }).partNumber).toBeNull();
    const { presetId: _none, ...withoutPreset } = driver;
    expect(parsed(driverSchema, withoutPreset).presetId).toBeNull();
    expect(parsed(driverSchema, { ...driver, presetId: null }).presetId).toBeNull();
    expect(parsed(driverSchema, { ...driver, partNumber: 7 }).partNumber).toBeNull();
    expect(refusedOn(driverSchema, { ...driver, presetId: 'no-such-class' }, 'presetId')).toMatch(SENTENCE);
  });

  // SLRS007B gives 1 A continuous and 2 A peak per channel: a peak equal to the continuous rating is
  // a rating with no surge headroom, and still a consistent one.
  it('the peak may equal but not be below the continuous rating', () => {
    expect(parsed(driverSchema, { ...driver, channelPeakAmps: '1' }).channelPeakAmps).toBe(1);
    expect(refusedOn(driverSchema, { ...driver, channelPeakAmps: '0.9' }, 'channelPeakAmps')).toMatch(SENTENCE);
  });

  // SLRS007B: typical 1.4 + 1.2 V, greatest 1.8 + 1.8 V at 1 A — the greatest line is never below the least.
  it('the greatest drop line may equal but not be below the least', () => {
    expect(parsed(driverSchema, { ...driver, dropMaxVolts: '1.4' }).dropMaxVolts).toBe(1.4);
    expect(refusedOn(driverSchema, { ...driver, dropMaxVolts: '1.3' }, 'dropMaxVolts')).toMatch(SENTENCE);
    expect(parsed(driverSchema, { ...driver, dropOhms: '0.5', dropMaxOhms: '' })).toMatchObject({ dropOhms: 0.5, dropMaxOhms: null });
    expect(parsed(driverSchema, { ...driver, dropOhms: '0.5', dropMaxOhms: '0.5' }).dropMaxOhms).toBe(0.5);
    expect(refusedOn(driverSchema, { ...driver, dropOhms: '0.5', dropMaxOhms: '0.4' }, 'dropMaxOhms')).toMatch(SENTENCE);
  });

  const locomotive = { name: 'Tank engine', runningAmps: '0.3', stallAmps: '1', ratedVolts: '12', topSpeedKmh: '80', startVolts: '' };

  it('stall current may equal but not be below the running current; the start voltage is below the rated one', () => {
    expect(parsed(locomotiveSchema, { ...locomotive, stallAmps: '0.3' }).stallAmps).toBe(0.3);
    expect(refusedOn(locomotiveSchema, { ...locomotive, stallAmps: '0.2' }, 'stallAmps')).toMatch(SENTENCE);
    expect(parsed(locomotiveSchema, locomotive).startVolts).toBeNull();
    expect(parsed(locomotiveSchema, { ...locomotive, startVolts: '3.5' }).startVolts).toBe(3.5);
    expect(refusedOn(locomotiveSchema, { ...locomotive, startVolts: '12' }, 'startVolts')).toMatch(SENTENCE);
  });
});

describe('form data', () => {
  it('keeps the first value of a field, every value of a listed one, and an empty list when none was sent', () => {
    const form = new FormData();
    form.append('name', 'Goods');
    form.append('name', 'ignored');
    form.append('locomotiveIds', 'l1');
    form.append('locomotiveIds', 'l2');
    form.append('image', new Blob(['x']));
    expect(formToObject(form, ['locomotiveIds', 'cabIds'])).toEqual({ name: 'Goods', locomotiveIds: ['l1', 'l2'], image: '', cabIds: [] });
    expect(formToObject(form)).toEqual({ name: 'Goods', locomotiveIds: 'l1', image: '' });
  });
});

describe('session settings', () => {
  const settings = {
    title: 'Running evening',
    date: '2031-01-15',
    startTime: '18:30',
    endTime: '21:30',
    clockRatio: '4',
    fastStart: '06:00',
    headwayS: '30',
    surgeS: '2',
    deratePercent: '80',
  };

  it('numbers come as text or JSON numbers; place and description default to blank', () => {
    expect(parsed(sessionSettingsSchema, settings)).toMatchObject({ clockRatio: 4, headwayS: 30, place: '', description: '' });
    expect(parsed(sessionSettingsSchema, { ...settings, clockRatio: 6, headwayS: ' 45 ' })).toMatchObject({ clockRatio: 6, headwayS: 45 });
  });

  it('a blank number is missing, not 0', () => {
    expect(refusedOn(sessionSettingsSchema, { ...settings, headwayS: '' }, 'headwayS')).toBe('Enter the headway in seconds.');
    expect(refusedOn(sessionSettingsSchema, { ...settings, headwayS: '   ' }, 'headwayS')).toBe('Enter the headway in seconds.');
    expect(refusedOn(sessionSettingsSchema, { ...settings, surgeS: 'two' }, 'surgeS')).toBe('Enter the surge time in seconds as a number.');
    expect(refusedOn(sessionSettingsSchema, { ...settings, deratePercent: '101' }, 'deratePercent')).toBe('Use 10 to 100.');
  });

  it('a date must exist in the calendar (ISO 8601 YYYY-MM-DD)', () => {
    expect(parsed(sessionSettingsSchema, { ...settings, date: '2032-02-29' }).date).toBe('2032-02-29'); // 2032 is a leap year
    expect(refusedOn(sessionSettingsSchema, { ...settings, date: '2031-02-29' }, 'date')).toBe('That date does not exist.');
    expect(refusedOn(sessionSettingsSchema, { ...settings, date: '2031-02-30' }, 'date')).toBe('That date does not exist.');
    expect(refusedOn(sessionSettingsSchema, { ...settings, date: '2031-13-01' }, 'date')).toBe('That date does not exist.');
    expect(refusedOn(sessionSettingsSchema, { ...settings, date: '15/01/2031' }, 'date')).toMatch(/YYYY-MM-DD/);
  });

  it('a status change may name how many errors the host agreed to publish with', () => {
    const status = { sessionId: 's1', version: '2', status: 'published' };
    expect(parsed(sessionStatusSchema, status).acknowledgedErrors).toBeUndefined();
    expect(parsed(sessionStatusSchema, { ...status, acknowledgedErrors: '3' }).acknowledgedErrors).toBe(3);
    expect(refusedOn(sessionStatusSchema, { ...status, version: '0' }, 'version')).toMatch(SENTENCE);
  });

  it('a copy of a session takes a new date and optionally a title', () => {
    expect(parsed(duplicateSessionSchema, { sessionId: 's1', date: '2031-03-01' })).toEqual({ sessionId: 's1', date: '2031-03-01' });
    expect(refusedOn(duplicateSessionSchema, { sessionId: ' ', date: '2031-03-01' }, 'sessionId')).toMatch(SENTENCE);
  });
});

describe('runs', () => {
  const byRoute = { trainId: 't', cabId: 'c', depart: '06:30', waypoints: ['a', 'b'], speedKmh: 60 };

  it('a run from a route: stands default to 60 s and 120 s, no operator, no note; seconds may be given', () => {
    expect(parsed(createRunSchema, byRoute)).toMatchObject({ operatorId: null, standBeforeS: 60, standAfterS: 120, note: '' });
    expect(parsed(createRunSchema, { ...byRoute, depart: '06:30:15' })).toMatchObject({ depart: '06:30:15' });
    expect(createRunSchema.safeParse({ ...byRoute, depart: '24:00' }).success).toBe(false);
    expect(createRunSchema.safeParse({ ...byRoute, waypoints: ['a'] }).success).toBe(false);
  });

  it('a run given step by step', () => {
    const steps = { trainId: 't', cabId: 'c', departS: 0, arriveS: 30, steps: [{ blockId: 'a', enterS: 0, exitS: 30 }] };
    expect(parsed(createRunSchema, steps)).toMatchObject({ speedKmh: null, operatorId: null });
    expect(createRunSchema.safeParse({ ...steps, steps: [] }).success).toBe(false);
  });

  it('an edit changes the departure, the timing or the steps, one at a time', () => {
    expect(parsed(updateRunSchema, { version: 1, depart: '07:00' })).toEqual({ version: 1, depart: '07:00' });
    expect(parsed(updateRunSchema, { version: 1, note: 'late' })).toEqual({ version: 1, note: 'late' });
    expect(refusedOn(updateRunSchema, { version: 1, depart: '07:00', departS: 60 }, 'depart')).toMatch(SENTENCE);
    expect(refusedOn(updateRunSchema, { version: 1, departS: 60, timing: { waypoints: ['a', 'b'], speedKmh: 40 } }, 'depart')).toMatch(SENTENCE);
  });

  it('a retime move shifts a run by up to a week either way, never by nothing', () => {
    const move = (delayS: number) => ({ moves: [{ runId: 'r', version: 1, delayS }] });
    expect(parsed(retimeMovesSchema, move(7 * 86_400)).moves[0]!.delayS).toBe(604_800);
    expect(parsed(retimeMovesSchema, move(-7 * 86_400)).moves[0]!.delayS).toBe(-604_800);
    expect(refusedOn(retimeMovesSchema, move(7 * 86_400 + 1), 'moves.0.delayS')).toMatch(/week/);
    expect(refusedOn(retimeMovesSchema, move(-7 * 86_400 - 1), 'moves.0.delayS')).toMatch(/week/);
    expect(refusedOn(retimeMovesSchema, move(0), 'moves.0.delayS')).toMatch(SENTENCE);
  });
});

describe('accounts', () => {
  it('an e-mail address is trimmed and lower-cased (RFC 5321 4.5.3.1.3: at most 254 characters in a path)', () => {
    expect(parsed(emailSchema, '  Ann@Example.ORG ')).toBe('ann@example.org');
    expect(emailSchema.safeParse(`${'a'.repeat(64)}@${'b'.repeat(185)}.org`).success).toBe(true); // 254
    expect(emailSchema.safeParse(`${'a'.repeat(64)}@${'b'.repeat(186)}.org`).success).toBe(false); // 255
    expect(emailSchema.safeParse('not an address').success).toBe(false);
  });

  it('sign-up needs a 10-character password; sign-in takes any non-empty one', () => {
    const up = { name: 'Ann', email: 'ann@example.org', password: 'x'.repeat(10) };
    expect(parsed(signUpSchema, up).password).toBe(up.password);
    expect(refusedOn(signUpSchema, { ...up, password: 'x'.repeat(9) }, 'password')).toMatch(/10/);
    expect(refusedOn(signUpSchema, { ...up, name: '  ' }, 'name')).toMatch(SENTENCE);
    expect(parsed(signInSchema, { email: up.email, password: 'x' }).password).toBe('x');
  });

  it('a new password is typed twice', () => {
    const reset = { token: 't'.repeat(32), password: 'x'.repeat(12), confirm: 'x'.repeat(12) };
    expect(parsed(resetPasswordSchema, reset).password).toBe(reset.password);
    expect(refusedOn(resetPasswordSchema, { ...reset, confirm: 'y'.repeat(12) }, 'confirm')).toMatch(SENTENCE);
  });

  it('a railway keeps an IANA time zone, or UTC (not in every runtime’s list)', () => {
    const railway = { name: 'Valley line' };
    expect(parsed(railwaySchema, { ...railway, timeZone: 'Pacific/Auckland' }).timeZone).toBe('Pacific/Auckland');
    expect(parsed(railwaySchema, { ...railway, timeZone: 'UTC' }).timeZone).toBe('UTC');
    expect(refusedOn(railwaySchema, { ...railway, timeZone: 'Mars/Olympus' }, 'timeZone')).toMatch(SENTENCE);
    expect(refusedOn(changeRoleSchema, { userId: 'u', role: 'owner' }, 'role')).toMatch(/host, planner or operator/);
  });
});

describe('invitations', () => {
  it('guest addresses are split on commas, semicolons, spaces and new lines, lower-cased and listed once', () => {
    expect(parsed(guestEmailsSchema, ' Ann@Example.org, bob@example.org;ann@example.org\ncy@example.org  ')).toEqual([
      'ann@example.org',
      'bob@example.org',
      'cy@example.org',
    ]);
    expect(parsed(guestEmailsSchema, '')).toEqual([]);
    expect(guestEmailsSchema.safeParse('ann@example.org, nobody').success).toBe(false);
  });

  it('an invitation names at least one member or guest', () => {
    expect(parsed(inviteCrewSchema, { userIds: ['u1'], guestEmails: '' })).toEqual({ userIds: ['u1'], guestEmails: [] });
    expect(parsed(inviteCrewSchema, { userIds: [], guestEmails: 'ann@example.org' })).toEqual({ userIds: [], guestEmails: ['ann@example.org'] });
    expect(refusedOn(inviteCrewSchema, { userIds: [], guestEmails: ' ' }, 'userIds')).toMatch(SENTENCE);
  });

  it('a reply link carries a token and one of the three answers (RFC 5545 3.2.12 PARTSTAT)', () => {
    const reply = { token: 't'.repeat(40), reply: 'tentative' };
    expect(parsed(replyByTokenSchema, reply)).toEqual({ ...reply, comment: '' });
    expect(refusedOn(replyByTokenSchema, { ...reply, reply: 'needs-action' }, 'reply')).toMatch(SENTENCE);
  });
});

describe('the session day', () => {
  it('only start and set take a fast time, and set needs one', () => {
    expect(parsed(clockActionSchema, { action: 'start' })).toEqual({ action: 'start' });
    expect(parsed(clockActionSchema, { action: 'start', fast: '06:00' })).toEqual({ action: 'start', fast: '06:00' });
    expect(parsed(clockActionSchema, { action: 'set', fast: ' 07:15 ' })).toEqual({ action: 'set', fast: '07:15' });
    expect(parsed(clockActionSchema, { action: 'pause' })).toEqual({ action: 'pause' });
    expect(refusedOn(clockActionSchema, { action: 'set' }, 'fast')).toMatch(SENTENCE);
    expect(refusedOn(clockActionSchema, { action: 'pause', fast: '06:00' }, 'fast')).toMatch(SENTENCE);
    expect(refusedOn(clockActionSchema, { action: 'resume', fast: '06:00' }, 'fast')).toMatch(SENTENCE);
    expect(refusedOn(clockActionSchema, { action: 'set', fast: '6:00' }, 'fast')).toMatch(/HH:MM/);
  });

  it('only a stop has a reason, and a stop must give one unless it is withdrawn; a withdrawal has no time', () => {
    expect(parsed(reportSchema, { kind: 'departed' })).toEqual({ kind: 'departed' });
    expect(parsed(reportSchema, { kind: 'stopped', reason: 'derailed' })).toEqual({ kind: 'stopped', reason: 'derailed' });
    expect(parsed(reportSchema, { kind: 'stopped', withdraw: true })).toEqual({ kind: 'stopped', withdraw: true });
    expect(parsed(reportSchema, { kind: 'arrived', fast: '07:00' })).toEqual({ kind: 'arrived', fast: '07:00' });
    expect(parsed(reportSchema, { kind: 'arrived', withdraw: true })).toEqual({ kind: 'arrived', withdraw: true });
    expect(refusedOn(reportSchema, { kind: 'arrived', reason: 'stalled' }, 'reason')).toMatch(SENTENCE);
    expect(refusedOn(reportSchema, { kind: 'stopped' }, 'reason')).toMatch(/stalled, derailed or blocked/);
    expect(refusedOn(reportSchema, { kind: 'arrived', withdraw: true, fast: '07:00' }, 'fast')).toMatch(SENTENCE);
    expect(refusedOn(reportSchema, { kind: 'arrived', extra: 1 }, '')).toBeTruthy();
  });

  it('a repair moves runs later by up to a day', () => {
    expect(parsed(repairSchema, { moves: [{ runId: ' r1 ', delayS: 86_400 }] })).toEqual({ moves: [{ runId: 'r1', delayS: 86_400 }] });
    expect(refusedOn(repairSchema, { moves: [{ runId: 'r1', delayS: 0 }] }, 'moves.0.delayS')).toMatch(SENTENCE);
    expect(refusedOn(repairSchema, { moves: [] }, 'moves')).toMatch(SENTENCE);
  });

  it('query strings: polling after an event number, a report as JSON or CSV with a punctuality window', () => {
    expect(parsed(livePollSchema, {})).toEqual({ after: 0 });
    expect(parsed(livePollSchema, { after: '12' })).toEqual({ after: 12 });
    expect(livePollSchema.safeParse({ after: '-1' }).success).toBe(false);
    expect(parsed(reportQuerySchema, {})).toEqual({ format: 'json' });
    expect(parsed(reportQuerySchema, { format: 'csv', punctualMin: '3' })).toEqual({ format: 'csv', punctualMin: 3 });
    expect(reportQuerySchema.safeParse({ punctualMin: '121' }).success).toBe(false);
  });
});
