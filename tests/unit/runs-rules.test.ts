// assertRunsValid: the rules a run keeps to be written. Worked examples on the control tests' plan
// (three 2 m blocks b1–b3), its run `out` retimed by hand to whole seconds: depart 0, b1 0–10,
// b2 10–20, b3 20–30, arrive 30. The session's window is 0 to its length in seconds, both ends
// included (common practice: a run may leave at the first second and arrive at the last).
import { describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { assertRunsValid } from '@/lib/runs/rules';
import { plan as workedExample } from './control/worked-example-plan';

const start = new Date('2026-03-07T09:00:00Z');
const session = (lengthS: number) => ({ startsAt: start, endsAt: new Date(start.getTime() + lengthS * 1000) });

type Edit = { departS?: number; arriveS?: number; steps?: [number, number][]; trainId?: string };
function planWith(edit: Edit = {}, back: Edit = {}) {
  const p = workedExample();
  const retimed = (run: (typeof p.runs)[number], e: Edit, base: number) => {
    const times = e.steps ?? [[base, base + 10], [base + 10, base + 20], [base + 20, base + 30]];
    return {
      ...run,
      trainId: e.trainId ?? run.trainId,
      departS: e.departS ?? base,
      arriveS: e.arriveS ?? base + 30,
      steps: run.steps.map((s, i) => ({ ...s, enterS: times[i]![0], exitS: times[i]![1] })),
    };
  };
  return { ...p, runs: [retimed(p.runs[0]!, edit, 0), retimed(p.runs[1]!, back, 100)] };
}

/** The refusal of assertRunsValid: its message and its issues (fails when it does not refuse). */
function refusal(plan: ReturnType<typeof planWith>, ids: string[], lengthS: number) {
  try {
    assertRunsValid(plan, new Set(ids), session(lengthS));
  } catch (e) {
    expect(e).toBeInstanceOf(AppError);
    const err = e as AppError;
    expect(err.status).toBe(400);
    return { message: err.message, issues: err.extra.issues };
  }
  throw new Error('assertRunsValid took the plan');
}

const window = (lengthS: number) => `must lie within the session, 0 to ${lengthS} s after its start`;

describe('assertRunsValid: times inside the session', () => {
  it('takes runs that leave at second 0 and arrive at the session’s last second (both ends included)', () => {
    expect(() => assertRunsValid(planWith(), new Set(['out']), session(30))).not.toThrow();
    expect(() => assertRunsValid(planWith(), new Set(['out', 'back']), session(130))).not.toThrow();
  });

  it('refuses an arrival one second after the end, naming the arrival and the last step', () => {
    expect(refusal(planWith(), ['out'], 29)).toEqual({
      message: `arriveS: ${window(29)}`,
      issues: [
        { path: 'arriveS', message: window(29) },
        { path: 'steps[2]', message: window(29) },
      ],
    });
  });

  it('refuses a departure before the start, naming the departure and the first step', () => {
    const early = planWith({ departS: -1, steps: [[-1, 10], [10, 20], [20, 30]] });
    expect(refusal(early, ['out'], 60)).toEqual({
      message: `departS: ${window(60)}`,
      issues: [
        { path: 'departS', message: window(60) },
        { path: 'steps[0]', message: window(60) },
      ],
    });
  });

  it('names a step whose entry alone, or exit alone, is outside', () => {
    expect(refusal(planWith({ departS: 0, steps: [[-5, 10], [10, 20], [20, 30]] }), ['out'], 60).issues).toEqual([{ path: 'steps[0]', message: window(60) }]);
    expect(refusal(planWith({ steps: [[0, 10], [10, 20], [20, 61]], arriveS: 30 }), ['out'], 60).issues).toEqual([{ path: 'steps[2]', message: window(60) }]);
    expect(refusal(planWith({ steps: [[0, 10], [10, 61], [20, 30]] }), ['out'], 60).issues).toEqual([{ path: 'steps[1]', message: window(60) }]);
  });

  it('leaves alone a run outside the window that the caller did not name', () => {
    // `back` runs from 100 to 130, after a 60 s session; only `out` is being written.
    expect(() => assertRunsValid(planWith(), new Set(['out']), session(60))).not.toThrow();
    expect(refusal(planWith(), ['back'], 60).issues).toEqual([
      { path: 'departS', message: window(60) },
      { path: 'arriveS', message: window(60) },
      { path: 'steps[0]', message: window(60) },
    ]);
  });
});

describe('assertRunsValid: the interchange’s own checks, for the named runs only', () => {
  it('refuses a named run whose train is not in the plan, naming the field', () => {
    const { message, issues } = refusal(planWith({ trainId: 'nobody' }), ['out'], 600);
    expect(issues).toHaveLength(1);
    expect(issues![0]!.path).toBe('trainId');
    expect(message).toBe(`trainId: ${issues![0]!.message}`);
  });

  it('lets an edit through when the broken run is another one, or the issue is outside the runs', () => {
    expect(() => assertRunsValid(planWith({}, { trainId: 'nobody' }), new Set(['out']), session(600))).not.toThrow();
    const p = planWith();
    const broken = { ...p, cabs: p.cabs.map((c) => ({ ...c, driverId: 'no-driver' })) };
    expect(() => assertRunsValid(broken, new Set(['out']), session(600))).not.toThrow();
  });
});
