/**
 * Issue 10, the engine's part of findings 2, 3 and 6: plans built to hurt the server. Each test
 * is named after the finding it keeps closed.
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, CheckBudgetError, FINDING_KINDS, FINDING_LIMITS, formatPlanIssues, PLAN_LIMITS, planSchema, toPlanJson, type Plan } from '@/lib/planning';
import { identicalRunsPlan } from '@/lib/cli/identical-runs-plan';

const pairs = (n: number) => (n * (n - 1)) / 2;

describe('issue 10 finding 3: quadratic stall', () => {
  it('1,000 identical runs: every clash counted exactly, the list capped and marked truncated', () => {
    const plan = identicalRunsPlan(1000);
    expect(planSchema.safeParse(toPlanJson(plan)).success).toBe(true);
    const check = checkPlan(plan);
    // Every pair of the 1,000 runs meets in each of the three blocks and shares cab, operator and locomotive.
    expect(check.counts['block-overlap']).toBe(3 * pairs(1000));
    expect(check.counts['cab-double-booked']).toBe(pairs(1000));
    expect(check.counts['operator-double-booked']).toBe(pairs(1000));
    expect(check.counts['locomotive-in-two-trains']).toBe(pairs(1000));
    expect(check.truncated).toBe(true);
    expect(check.findings.length).toBe(FINDING_LIMITS.total);
    for (const kind of FINDING_KINDS) {
      expect(check.findings.filter((f) => f.kind === kind).length).toBeLessThanOrEqual(Math.min(FINDING_LIMITS.perKind, check.counts[kind]));
    }
  });

  it('lists every finding and says nothing is cut when the plan is under the caps', () => {
    const check = checkPlan(identicalRunsPlan(10));
    expect(check.truncated).toBe(false);
    expect(check.findings.length).toBe(FINDING_KINDS.reduce((sum, kind) => sum + check.counts[kind], 0));
    expect(check.counts['block-overlap']).toBe(3 * pairs(10));
  });

  it('caps per kind and in all as asked, keeping the earliest of the listed', () => {
    const check = checkPlan(identicalRunsPlan(40), { maxPerKind: 5, maxFindings: 12 });
    expect(check.findings).toHaveLength(12);
    expect(check.truncated).toBe(true);
    for (const kind of FINDING_KINDS) expect(check.findings.filter((f) => f.kind === kind).length).toBeLessThanOrEqual(5);
    expect(check.counts['locomotive-in-two-trains']).toBe(pairs(40));
  });

  it('lists exactly the per-kind cap of each kind that has more, and counts every finding in the totals by severity', () => {
    // 12 identical runs: 3 × 66 block overlaps, 66 pairs each on cab, operator and locomotive.
    const check = checkPlan(identicalRunsPlan(12), { maxPerKind: 5 });
    const severityOf = new Map(check.findings.map((f) => [f.kind, f.severity]));
    let errors = 0;
    let warnings = 0;
    for (const kind of FINDING_KINDS) {
      const count = check.counts[kind];
      expect(check.findings.filter((f) => f.kind === kind), kind).toHaveLength(Math.min(5, count));
      if (count > 0) expect(severityOf.has(kind), kind).toBe(true);
      if (severityOf.get(kind) === 'error') errors += count;
      if (severityOf.get(kind) === 'warning') warnings += count;
    }
    expect(check.counts['block-overlap']).toBe(3 * pairs(12));
    expect(check.counts['cab-double-booked']).toBe(pairs(12));
    expect(check.totals).toEqual({ errors, warnings });
    // Errors at least: the overlaps and the cab, operator and locomotive double bookings.
    expect(check.totals.errors).toBeGreaterThanOrEqual(3 * pairs(12) + 3 * pairs(12));
    // The same plan uncapped: the same counts and totals, every finding listed.
    const all = checkPlan(identicalRunsPlan(12));
    expect(all.counts).toEqual(check.counts);
    expect(all.totals).toEqual(check.totals);
    expect(all.findings).toHaveLength(errors + warnings);
  });

  it('refuses plans past the run and step limits in the schema', () => {
    const many = identicalRunsPlan(PLAN_LIMITS.runs + 1);
    expect(formatPlanIssues(planSchema.safeParse(toPlanJson(many)).error!)).toContain(`runs: must hold ${PLAN_LIMITS.runs} or fewer`);
    const long = identicalRunsPlan(1);
    long.runs[0]!.steps = Array.from({ length: PLAN_LIMITS.stepsPerRun + 1 }, (_, k) => ({ blockId: 'A', enterS: k, exitS: k + 1 }));
    long.runs[0]!.arriveS = PLAN_LIMITS.stepsPerRun;
    expect(formatPlanIssues(planSchema.safeParse(toPlanJson(long)).error!)).toContain(`runs[0].steps: a run has at most ${PLAN_LIMITS.stepsPerRun} steps`);
    const wide = identicalRunsPlan(PLAN_LIMITS.steps / 250 + 1);
    for (const run of wide.runs) run.steps = Array.from({ length: 250 }, (_, k) => ({ blockId: 'A', enterS: k / 10, exitS: k / 10 + 1 }));
    expect(formatPlanIssues(planSchema.safeParse(toPlanJson(wide)).error!)[0]).toMatch(/^runs: the runs have \d+ steps in all; a plan holds at most 100000$/);
  });

  it('gives up with CheckBudgetError once the time budget is spent', () => {
    let clock = 0;
    // A clock that moves a second each time it is read: the first phase already overruns 1.5 s.
    const now = () => (clock += 1000);
    expect(() => checkPlan(identicalRunsPlan(3), { budget: { ms: 1500, now } })).toThrow(CheckBudgetError);
    expect(checkPlan(identicalRunsPlan(3), { budget: { ms: 1500, now: () => 0 } }).findings.length).toBeGreaterThan(0);
    // The budget runs from the first reading, whatever the clock's origin: a clock standing at 10⁶ ms
    // is within it, and so is one that has moved exactly the budget (more than it is needed to give up).
    expect(checkPlan(identicalRunsPlan(3), { budget: { ms: 1500, now: () => 1e6 } }).findings.length).toBeGreaterThan(0);
    let reads = 0;
    const exactly = () => (reads++ === 0 ? 0 : 1500);
    expect(checkPlan(identicalRunsPlan(3), { budget: { ms: 1500, now: exactly } }).findings.length).toBeGreaterThan(0);
  });
});

describe('issue 10 finding 2: times and sizes in the plan schema are bounded', () => {
  const refusal = (edit: (plan: Plan) => void) => {
    const plan = identicalRunsPlan(1);
    edit(plan);
    const result = planSchema.safeParse(toPlanJson(plan));
    return result.success ? [] : formatPlanIssues(result.error);
  };

  it('refuses the report’s run (departS 0, arriveS 1e12 with matching steps)', () => {
    const issues = refusal((p) => {
      p.runs[0]!.arriveS = 1e12;
      p.runs[0]!.steps[2]!.exitS = 1e12;
    });
    expect(issues).toContain(`runs[0].arriveS: must be ${PLAN_LIMITS.latestS} s or earlier (a week after the session's start)`);
    expect(issues).toContain(`runs[0].steps[2].exitS: must be ${PLAN_LIMITS.latestS} s or earlier (a week after the session's start)`);
  });

  it('refuses a time more than a day before the session', () => {
    expect(refusal((p) => void (p.runs[0]!.steps[0]!.enterS = -1e9))).toContain(
      `runs[0].steps[0].enterS: must be ${PLAN_LIMITS.earliestS} s or later (a day before the session)`,
    );
  });

  it('refuses a scale ratio of 1e308 and lengths and currents out of any physical range', () => {
    expect(refusal((p) => void (p.scale.ratio = 1e308))).toContain('scale.ratio: must be 1000 or less');
    expect(refusal((p) => void (p.blocks[0]!.lengthMm = 1e12))).toContain('blocks[0].lengthMm: must be 1000000 or less');
    expect(refusal((p) => void (p.trains[0]!.lengthMm = 1e9))).toContain('trains[0].lengthMm: must be 100000 or less');
    expect(refusal((p) => void (p.locomotives[0]!.stallAmps = 1e6))).toContain('locomotives[0].stallAmps: must be 100 or less');
    expect(refusal((p) => void (p.clock.ratio = 1e6))).toContain('clock.ratio: must be 60 or less');
  });

  it('still accepts a session of a whole week and a stand from the day before', () => {
    expect(
      refusal((p) => {
        p.runs[0]!.steps[0]!.enterS = -3600;
        p.runs[0]!.arriveS = PLAN_LIMITS.latestS - 1;
        p.runs[0]!.steps[2]!.exitS = PLAN_LIMITS.latestS;
      }),
    ).toEqual([]);
  });
});

describe('issue 10 finding 6: calendar injection through ids', () => {
  const idRefused = (edit: (plan: Plan, bad: string) => void, bad: string) => {
    const plan = identicalRunsPlan(1);
    edit(plan, bad);
    return planSchema.safeParse(toPlanJson(plan)).success === false;
  };
  const hostile = [
    'r1\r\nBEGIN:VALARM\r\nACTION:DISPLAY\r\nEND:VALARM',
    'r1\nX-INJECTED:1',
    'r;1',
    'r,1',
    'r\\1',
    'r 1',
    '"r1"',
    '-r1',
    'x'.repeat(65),
    '',
  ];

  it('refuses every id that could end a calendar line or break a value', () => {
    for (const bad of hostile) {
      expect(idRefused((p, id) => void (p.runs[0]!.id = id), bad)).toBe(true);
      expect(idRefused((p, id) => void (p.blocks[0]!.id = id), bad)).toBe(true);
      expect(idRefused((p, id) => void (p.operators[0]!.id = id), bad)).toBe(true);
    }
  });

  it('accepts the ids the app and tools use: UUIDs, short codes, dotted and coloned names', () => {
    for (const good of ['b3c1f0f2-5a2e-4c44-9d55-3d8c3a7f0a11', 'b3c1f0f25a2e4c449d553d8c3a7f0a11', 'r1', 'L12-B3', 'yard.road_1', 'urn:x', 'x'.repeat(64)]) {
      expect(idRefused((p, id) => void (p.runs[0]!.id = id), good)).toBe(false);
    }
  });
});
