// The run's schemas, one bad field at a time: each refusal names the field and says what is wrong.
// The schema module is loaded again inside each test (vi.resetModules, then import): its schemas are
// built when the module is evaluated, and a module imported at the top of this file would be built
// before a mutation test run switches a change on (Stryker's Vitest runner does that in a beforeAll).
// Limits come from the tests' own table (tests/shared/expected-bounds.ts), never from the schema.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { RUN_LIMITS, RUN_TIMING_BOUNDS, SERIES_BOUNDS } from '../shared/expected-bounds';
import { plan as workedExample } from './control/worked-example-plan';

type Schemas = typeof import('@/lib/runs/schema');
let S: Schemas;

beforeEach(async () => {
  vi.resetModules();
  S = await import('@/lib/runs/schema');
});

type Issue = { path: PropertyKey[]; message: string; code?: string; errors?: Issue[][] };
type Parse = { safeParse: (v: unknown) => { success: boolean; data?: unknown; error?: { issues: Issue[] } } };

/** Issues as `path: message`; a union's refusal lists the issues of each of its forms. */
const flat = (issues: Issue[], at: PropertyKey[] = []): string[] =>
  issues.flatMap((i) => (i.code === 'invalid_union' && i.errors?.length ? i.errors.flatMap((e) => flat(e, [...at, ...i.path])) : [`${[...at, ...i.path].join('.')}: ${i.message}`]));

/** The issues of a refused input as `path: message`; fails when the input is taken. */
function refusal(schema: Parse, input: unknown): string[] {
  const result = schema.safeParse(input);
  expect(result.success, String(JSON.stringify(input)).slice(0, 200)).toBe(false);
  return flat(result.error?.issues ?? []);
}

function parsed<T>(schema: { safeParse: (v: unknown) => { success: boolean; data?: T; error?: unknown } }, input: unknown): T {
  const result = schema.safeParse(input);
  expect(result.success, JSON.stringify(result.error ?? null).slice(0, 400)).toBe(true);
  return result.data as T;
}

const bound = (field: string) => [...RUN_TIMING_BOUNDS, ...SERIES_BOUNDS].find((b) => b.field === field)!;
const ids = (n: number, prefix = 'b') => Array.from({ length: n }, (_, i) => `${prefix}${i}`);
const stepsOf = (n: number) => ids(n).map((blockId, i) => ({ blockId, enterS: i * 10, exitS: i * 10 + 10 }));

/** A new run by its fast-clock departure and a route to time. */
const byRoute = () => ({ trainId: 't1', cabId: 'c1', depart: '06:45', waypoints: ['b1', 'b2'], speedKmh: 60 });
/** A new run with every field given (how an undo puts a deleted run back). */
const whole = () => ({ trainId: 't1', cabId: 'c1', departS: 0, arriveS: 100, steps: [{ blockId: 'b1', enterS: 0, exitS: 100 }] });

describe('createRunSchema, by route (fast-clock departure, waypoints and a speed)', () => {
  it('takes the form and fills in what it leaves out: no operator, an empty note, stands of 60 s and 120 s', () => {
    const run = parsed(S.createRunSchema, byRoute()) as Record<string, unknown>;
    expect(run).toEqual({
      trainId: 't1',
      cabId: 'c1',
      operatorId: null,
      note: '',
      depart: '06:45',
      waypoints: ['b1', 'b2'],
      speedKmh: 60,
      standBeforeS: 60,
      standAfterS: 120,
    });
  });

  it('refuses an empty id and one too long, naming the field (ids: ' + RUN_LIMITS.idChars.source + ')', () => {
    expect(refusal(S.createRunSchema, { ...byRoute(), trainId: '  ' })).toContain('trainId: Choose one.');
    expect(refusal(S.createRunSchema, { ...byRoute(), cabId: 'x'.repeat(RUN_LIMITS.idChars.max + 1) })).toContain('cabId: That id is too long.');
    expect(parsed(S.createRunSchema, { ...byRoute(), cabId: ' ' + 'x'.repeat(RUN_LIMITS.idChars.max) + ' ' })).toMatchObject({ cabId: 'x'.repeat(RUN_LIMITS.idChars.max) });
    expect(refusal(S.createRunSchema, { ...byRoute(), trainId: 7 })).not.toHaveLength(0);
  });

  it('refuses a departure that is missing or not HH:MM', () => {
    const { depart: _, ...noDepart } = byRoute();
    void _;
    expect(refusal(S.createRunSchema, noDepart)).toContain('depart: Enter the departure on the fast clock.');
    expect(refusal(S.createRunSchema, { ...byRoute(), depart: '6.45' })).toContain('depart: Enter the departure as HH:MM on the fast clock, e.g. 06:45.');
    // Seconds are allowed on the fast clock.
    expect(parsed(S.createRunSchema, { ...byRoute(), depart: '06:45:30' })).toMatchObject({ depart: '06:45:30' });
  });

  it(`waypoints: ${RUN_LIMITS.waypoints.min} to ${RUN_LIMITS.waypoints.max} (${RUN_LIMITS.waypoints.source})`, () => {
    expect(refusal(S.createRunSchema, { ...byRoute(), waypoints: ids(RUN_LIMITS.waypoints.min - 1) })).toContain('waypoints: Pick at least the first and the last block.');
    expect(refusal(S.createRunSchema, { ...byRoute(), waypoints: ids(RUN_LIMITS.waypoints.max + 1) })).toContain('waypoints: At most 100 blocks.');
    parsed(S.createRunSchema, { ...byRoute(), waypoints: ids(RUN_LIMITS.waypoints.min) });
    parsed(S.createRunSchema, { ...byRoute(), waypoints: ids(RUN_LIMITS.waypoints.max) });
    expect(refusal(S.createRunSchema, { ...byRoute(), waypoints: ['b1', ''] })).toContain('waypoints.1: Choose one.');
  });

  it(`speedKmh: more than 0 to ${bound('speedKmh').max} (${bound('speedKmh').source})`, () => {
    const b = bound('speedKmh');
    const { speedKmh: _, ...noSpeed } = byRoute();
    void _;
    expect(refusal(S.createRunSchema, noSpeed)).toContain('speedKmh: Enter a scale speed.');
    expect(refusal(S.createRunSchema, { ...byRoute(), speedKmh: b.min })).toContain('speedKmh: The speed must be more than 0 km/h.');
    expect(refusal(S.createRunSchema, { ...byRoute(), speedKmh: b.max + 1 })).toContain('speedKmh: Use at most 500 km/h.');
    parsed(S.createRunSchema, { ...byRoute(), speedKmh: b.max });
    parsed(S.createRunSchema, { ...byRoute(), speedKmh: b.min + 0.5 });
  });

  for (const field of ['standBeforeS', 'standAfterS'] as const) {
    it(`${field}: ${bound(field).min} to ${bound(field).max} (${bound(field).source})`, () => {
      const b = bound(field);
      expect(refusal(S.createRunSchema, { ...byRoute(), [field]: b.min - 1 })).toContain(`${field}: Use 0 or more seconds.`);
      expect(refusal(S.createRunSchema, { ...byRoute(), [field]: b.max + 1 })).toContain(`${field}: Use at most 3600 s.`);
      expect(parsed(S.createRunSchema, { ...byRoute(), [field]: b.min })).toMatchObject({ [field]: b.min });
      expect(parsed(S.createRunSchema, { ...byRoute(), [field]: b.max })).toMatchObject({ [field]: b.max });
    });
  }

  it(`note: at most ${RUN_LIMITS.noteChars.max} characters, trimmed (${RUN_LIMITS.noteChars.source})`, () => {
    expect(refusal(S.createRunSchema, { ...byRoute(), note: 'n'.repeat(RUN_LIMITS.noteChars.max + 1) })).toContain('note: Use at most 500 characters.');
    expect(parsed(S.createRunSchema, { ...byRoute(), note: `  ${'n'.repeat(RUN_LIMITS.noteChars.max)}  ` })).toMatchObject({ note: 'n'.repeat(RUN_LIMITS.noteChars.max) });
    expect(parsed(S.createRunSchema, { ...byRoute(), note: ' x ' })).toMatchObject({ note: 'x' });
  });
});

describe('createRunSchema, whole (every field given)', () => {
  it('takes the whole run and fills in no operator, no speed and an empty note', () => {
    expect(parsed(S.createRunSchema, whole())).toEqual({ ...whole(), operatorId: null, speedKmh: null, note: '' });
  });

  it('keeps the direction of travel of a step; refuses an end other than a or b', () => {
    const steps = [{ blockId: 'b1', enterS: 0, exitS: 100, fromEnd: 'a', toEnd: 'b' }];
    expect(parsed(S.createRunSchema, { ...whole(), steps })).toMatchObject({ steps });
    expect(refusal(S.createRunSchema, { ...whole(), steps: [{ ...steps[0], fromEnd: 'c' }] })).not.toHaveLength(0);
    expect(refusal(S.createRunSchema, { ...whole(), steps: [{ ...steps[0], toEnd: '' }] })).not.toHaveLength(0);
  });

  it('refuses a time that is not a number, naming it', () => {
    expect(refusal(S.createRunSchema, { ...whole(), arriveS: '100' })).toContain('arriveS: Enter a time in seconds.');
    expect(refusal(S.createRunSchema, { ...whole(), steps: [{ blockId: 'b1', enterS: 0, exitS: null }] })).toContain('steps.0.exitS: Enter a time in seconds.');
  });

  it(`steps: ${RUN_LIMITS.steps.min} to ${RUN_LIMITS.steps.max} (${RUN_LIMITS.steps.source})`, () => {
    expect(refusal(S.createRunSchema, { ...whole(), steps: [] })).toContain('steps: A run needs at least one step.');
    expect(refusal(S.createRunSchema, { ...whole(), steps: stepsOf(RUN_LIMITS.steps.max + 1) })).toContain('steps: A run has at most 500 steps.');
    parsed(S.createRunSchema, { ...whole(), steps: stepsOf(RUN_LIMITS.steps.max) });
    parsed(S.createRunSchema, { ...whole(), steps: stepsOf(RUN_LIMITS.steps.min) });
    expect(S.MAX_STEPS_PER_RUN).toBe(RUN_LIMITS.steps.max);
  });

  it('refuses a speed out of bounds in a whole run too; null means not timed from a route', () => {
    expect(refusal(S.createRunSchema, { ...whole(), speedKmh: 0 })).toContain('speedKmh: The speed must be more than 0 km/h.');
    expect(parsed(S.createRunSchema, { ...whole(), speedKmh: null })).toMatchObject({ speedKmh: null });
    expect(parsed(S.createRunSchema, { ...whole(), operatorId: 'o1' })).toMatchObject({ operatorId: 'o1' });
  });
});

describe('updateRunSchema', () => {
  it('takes a version alone and an attribute; drops what an edit does not change directly (arrival)', () => {
    expect(parsed(S.updateRunSchema, { version: 1, note: ' late ', arriveS: 5 })).toEqual({ version: 1, note: 'late' });
  });

  it(`version: a whole number from ${RUN_LIMITS.version.min} (${RUN_LIMITS.version.source})`, () => {
    expect(refusal(S.updateRunSchema, {})).toEqual(['version: Say which version of the run you edited.']);
    expect(refusal(S.updateRunSchema, { version: RUN_LIMITS.version.min - 1 })).toEqual([expect.stringMatching(/^version: /)]);
    expect(refusal(S.updateRunSchema, { version: 1.5 })).toEqual([expect.stringMatching(/^version: /)]);
    parsed(S.updateRunSchema, { version: 2 });
  });

  it('takes one of departure, departS, timing or steps, and refuses two at once on depart', () => {
    parsed(S.updateRunSchema, { version: 1, depart: '07:00' });
    parsed(S.updateRunSchema, { version: 1, departS: 30 });
    expect(parsed(S.updateRunSchema, { version: 1, timing: { waypoints: ['a', 'b'], speedKmh: 40 } })).toEqual({
      version: 1,
      timing: { waypoints: ['a', 'b'], speedKmh: 40, standBeforeS: 60, standAfterS: 120 },
    });
    const steps = { departS: 0, arriveS: 10, steps: stepsOf(1) };
    expect(parsed(S.updateRunSchema, { version: 1, steps })).toEqual({ version: 1, steps });
    expect(refusal(S.updateRunSchema, { version: 1, depart: '07:00', departS: 30 })).toEqual(['depart: Change the departure, the timing or the steps, one at a time.']);
    expect(refusal(S.updateRunSchema, { version: 1, timing: { waypoints: ['a', 'b'], speedKmh: 40 }, steps })).toEqual([
      'depart: Change the departure, the timing or the steps, one at a time.',
    ]);
  });

  it('refuses bad fields inside the timing and the steps, naming them', () => {
    expect(refusal(S.updateRunSchema, { version: 1, steps: { departS: 0, arriveS: 10, steps: [] } })).toEqual(['steps.steps: A run needs at least one step.']);
    expect(refusal(S.updateRunSchema, { version: 1, steps: { arriveS: 10, steps: stepsOf(1) } })).toEqual(['steps.departS: Enter a time in seconds.']);
    expect(refusal(S.updateRunSchema, { version: 1, timing: { waypoints: ['a'], speedKmh: 40 } })).toEqual(['timing.waypoints: Pick at least the first and the last block.']);
    expect(refusal(S.updateRunSchema, { version: 1, departS: 'x' })).toEqual(['departS: Enter a time in seconds.']);
    expect(refusal(S.updateRunSchema, { version: 1, trainId: '' })).toEqual(['trainId: Choose one.']);
  });
});

describe('seriesSchema', () => {
  for (const [field, missing, whole, least, most] of [
    ['everyFastMin', 'Enter how many fast minutes apart.', 'Use whole minutes.', 'Use at least 1 minute.', 'Use at most 1440 minutes.'],
    ['count', 'Enter how many copies.', 'Use a whole number.', 'Make at least 1 copy.', 'Make at most 50 copies at once.'],
  ] as const) {
    it(`${field}: ${bound(field).min} to ${bound(field).max}, whole (${bound(field).source})`, () => {
      const b = bound(field);
      const valid = { everyFastMin: 30, count: 3 };
      expect(refusal(S.seriesSchema, { ...valid, [field]: undefined })).toEqual([`${field}: ${missing}`]);
      expect(refusal(S.seriesSchema, { ...valid, [field]: b.min + 0.5 })).toEqual([`${field}: ${whole}`]);
      expect(refusal(S.seriesSchema, { ...valid, [field]: b.min - 1 })).toEqual([`${field}: ${least}`]);
      expect(refusal(S.seriesSchema, { ...valid, [field]: b.max + 1 })).toEqual([`${field}: ${most}`]);
      expect(parsed(S.seriesSchema, { ...valid, [field]: b.min })).toEqual({ ...valid, [field]: b.min });
      expect(parsed(S.seriesSchema, { ...valid, [field]: b.max })).toEqual({ ...valid, [field]: b.max });
    });
  }
});

describe('retimeMovesSchema', () => {
  const move = (over: Record<string, unknown> = {}) => ({ runId: 'r1', version: 1, delayS: 60, ...over });

  it(`moves: ${RUN_LIMITS.moves.min} to ${RUN_LIMITS.moves.max} (${RUN_LIMITS.moves.source})`, () => {
    expect(refusal(S.retimeMovesSchema, { moves: [] })).toEqual(['moves: Nothing to move.']);
    const many = (n: number) => Array.from({ length: n }, (_, i) => move({ runId: `r${i}` }));
    expect(refusal(S.retimeMovesSchema, { moves: many(RUN_LIMITS.moves.max + 1) })).toEqual(['moves: At most 5000 runs at once.']);
    expect(parsed(S.retimeMovesSchema, { moves: many(RUN_LIMITS.moves.max) })).toEqual({ moves: many(RUN_LIMITS.moves.max) });
    expect(parsed(S.retimeMovesSchema, { moves: [move()] })).toEqual({ moves: [move()] });
  });

  it(`delayS: not 0, at most ${RUN_LIMITS.moveS.max} s either way (${RUN_LIMITS.moveS.source})`, () => {
    expect(refusal(S.retimeMovesSchema, { moves: [move({ delayS: 0 })] })).toEqual(['moves.0.delayS: A move must shift the run.']);
    expect(refusal(S.retimeMovesSchema, { moves: [move({ delayS: RUN_LIMITS.moveS.max + 1 })] })).toEqual(['moves.0.delayS: That is more than a week.']);
    expect(refusal(S.retimeMovesSchema, { moves: [move({ delayS: -RUN_LIMITS.moveS.max - 1 })] })).toEqual(['moves.0.delayS: That is more than a week.']);
    parsed(S.retimeMovesSchema, { moves: [move({ delayS: RUN_LIMITS.moveS.max })] });
    parsed(S.retimeMovesSchema, { moves: [move({ delayS: -RUN_LIMITS.moveS.max })] });
  });

  it(`version: a whole number from ${RUN_LIMITS.version.min}; runId: an id`, () => {
    expect(refusal(S.retimeMovesSchema, { moves: [move({ version: RUN_LIMITS.version.min - 1 })] })).toEqual([expect.stringMatching(/^moves\.0\.version: /)]);
    parsed(S.retimeMovesSchema, { moves: [move({ version: 7 })] });
    expect(refusal(S.retimeMovesSchema, { moves: [move({ runId: '' })] })).toEqual(['moves.0.runId: Choose one.']);
  });
});

describe('deleteRunQuerySchema (`?version=`)', () => {
  const message = 'Say which version of the run you are deleting (?version=).';
  it('reads the version from the query text, a whole number from 1', () => {
    expect(parsed(S.deleteRunQuerySchema, { version: '3' })).toEqual({ version: 3 });
    expect(parsed(S.deleteRunQuerySchema, { version: String(RUN_LIMITS.version.min) })).toEqual({ version: 1 });
    expect(refusal(S.deleteRunQuerySchema, { version: String(RUN_LIMITS.version.min - 1) })).toEqual([`version: ${message}`]);
    expect(refusal(S.deleteRunQuerySchema, { version: 'abc' })).toEqual([`version: ${message}`]);
    expect(refusal(S.deleteRunQuerySchema, { version: '1.5' })).toHaveLength(1);
  });
});

describe('fastTimeSchema', () => {
  it('takes HH:MM and HH:MM:SS, trimmed; refuses a missing time and other text with their messages', () => {
    expect(parsed(S.fastTimeSchema, ' 06:45 ')).toBe('06:45');
    expect(parsed(S.fastTimeSchema, '23:59:59')).toBe('23:59:59');
    expect(refusal(S.fastTimeSchema, undefined)).toEqual([': Enter the departure on the fast clock.']);
    expect(refusal(S.fastTimeSchema, 'noon')).toEqual([': Enter the departure as HH:MM on the fast clock, e.g. 06:45.']);
  });
});

describe('postedPlanSchema and toPlanRun', () => {
  // The control tests' worked example (a plan in the interchange, RFC 8259 JSON once posted), its runs
  // carrying a speed and a note beside the interchange's fields.
  const plan = () => {
    const p = workedExample();
    return { ...p, runs: p.runs.map((r) => ({ ...r, speedKmh: 80, note: ' via the loop ' })) };
  };

  it('keeps the fields outside the interchange on a posted run (speed and note) beside the run', () => {
    const posted = parsed(S.postedPlanSchema, plan()) as { runs: Record<string, unknown>[] };
    expect(posted.runs).toHaveLength(2);
    expect(posted.runs[0]).toMatchObject({ id: 'out', trainId: 't', speedKmh: 80, note: 'via the loop' });
  });

  it('refuses a posted run whose outside field is out of bounds, naming it', () => {
    const bad = plan();
    bad.runs[0]!.speedKmh = bound('speedKmh').max + 1;
    expect(refusal(S.postedPlanSchema, bad)).toEqual(['runs.0.speedKmh: Use at most 500 km/h.']);
  });

  it('toPlanRun keeps the direction of travel when recorded and leaves it out otherwise', () => {
    const run = {
      id: 'r1',
      trainId: 't1',
      cabId: 'c1',
      operatorId: null,
      departS: 0,
      arriveS: 20,
      steps: [
        { blockId: 'A', enterS: 0, exitS: 10, fromEnd: 'a' as const, toEnd: 'b' as const },
        { blockId: 'B', enterS: 10, exitS: 20 },
      ],
    };
    expect(S.toPlanRun(run)).toEqual(run);
    expect(Object.keys(S.toPlanRun(run).steps[1]!)).toEqual(['blockId', 'enterS', 'exitS']);
  });

  it('names the fields of a run, and those outside the interchange', () => {
    expect([...S.RUN_FIELD_NAMES].sort()).toEqual(['arriveS', 'cabId', 'departS', 'note', 'operatorId', 'speedKmh', 'steps', 'trainId']);
    expect(S.RUN_FIELDS_OUTSIDE_PLAN).toEqual(['speedKmh', 'note']);
  });
});
