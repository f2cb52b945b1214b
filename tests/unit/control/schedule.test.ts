import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Plan } from '@/lib/planning';
import { compileSchedule, type ControlSchedule, type WiringSheet } from '@/lib/control';
import { planArbitrary } from '../planning/plan-arbitrary';
import { changeTimes, stateAt } from './replay';

const TIMING = { leadS: 1, releaseS: 0.5, deadTimeMs: 300, breakMs: 50, accelerateS: 2, brakeS: 2 };

/**
 * A wiring that feeds every block from every cab; `towards` and `reversing` come from the generator.
 * `engine`: a sheet with no `forwardTowards` (the engine's ends and the blocks' wiring decide).
 */
function wiringFor(plan: Plan, towards: number[], reversing: boolean[], engine: boolean): WiringSheet {
  return {
    version: 1,
    boards: [{ id: 'board', kind: 'header40', name: 'Board', emergencyStopPin: 'GPIO4', startPin: null }],
    cabs: plan.cabs.map((c) => ({ cabId: c.id, boardId: 'board', forwardPin: 'x', reversePin: 'y', pwmPin: 'z', bothHighBrakes: false })),
    blocks: plan.blocks.map((b, i) => ({
      blockId: b.id,
      boardId: 'board',
      feeds: plan.cabs.map((c) => ({ cabId: c.id, pin: `${b.id}-${c.id}` })),
      polarityPin: reversing[i % reversing.length] ? `${b.id}-pol` : null,
      // Each block points forward at some of the others (a bit mask), so directions vary.
      forwardTowards: engine ? [] : plan.blocks.filter((_, j) => j !== i && ((towards[i % towards.length] ?? 0) >> j) & 1).map((o) => o.id),
    })),
    timing: TIMING,
  };
}

const controlCase = fc
  .record({
    plan: planArbitrary({ maxRuns: 8 }),
    towards: fc.array(fc.nat({ max: 63 }), { minLength: 1, maxLength: 6 }),
    reversing: fc.array(fc.boolean(), { minLength: 1, maxLength: 6 }),
    speeds: fc.array(fc.option(fc.integer({ min: 10, max: 90 }), { nil: null }), { minLength: 1, maxLength: 8 }),
    engine: fc.boolean(),
    rails: fc.array(fc.constantFrom('right' as const, 'left' as const, undefined), { minLength: 1, maxLength: 6 }),
  })
  .map(({ plan: generated, towards, reversing, speeds, engine, rails }) => {
    // The engine's way: each block's positive rail varies, so cab directions vary through the ends.
    const plan = engine ? { ...generated, blocks: generated.blocks.map((b, i) => ({ ...b, positiveRail: rails[i % rails.length] })) } : generated;
    const wiring = wiringFor(plan, towards, reversing, engine);
    const runSpeedKmh = Object.fromEntries(plan.runs.map((r, i) => [r.id, speeds[i % speeds.length] ?? null]));
    const locomotiveTopSpeedKmh = Object.fromEntries(plan.locomotives.map((l) => [l.id, 120]));
    return { plan, wiring, schedule: compileSchedule({ plan, wiring, runSpeedKmh, locomotiveTopSpeedKmh }) };
  });

const sToMs = (schedule: ControlSchedule, s: number) => (s - schedule.originS) * 1000;

describe('compileSchedule on random plans (the engine generators)', () => {
  it('never breaks an interlock, by an independent replay', () => {
    fc.assert(
      fc.property(controlCase, ({ plan, schedule }) => {
        const deadMs = schedule.timing.deadTimeMs;
        const times = changeTimes(schedule);
        // Dead time: at every direction change, the cab's PWM was 0 at each change point in the dead time before it.
        for (const e of schedule.entries) {
          if (e.kind !== 'direction') continue;
          const probes = [e.atMs - deadMs, ...times.filter((t) => t >= e.atMs - deadMs && t <= e.atMs)];
          for (const t of probes) expect(stateAt(schedule, t).pwm.get(e.cabId) ?? 0).toBe(0);
        }
        // One cab per block; a release at least breakMs before the next connect; no switching with current in the block.
        const feed = new Map<string, string | null>();
        const released = new Map<string, number>();
        const scheduled = new Set(schedule.runs.map((r) => r.runId));
        for (const e of schedule.entries) {
          if (e.kind !== 'feed') continue;
          const before = feed.get(e.blockId) ?? null;
          if (e.cabId !== null) {
            expect(before).toBeNull();
            expect(e.atMs - (released.get(e.blockId) ?? -Infinity)).toBeGreaterThanOrEqual(schedule.timing.breakMs);
          } else released.set(e.blockId, e.atMs);
          feed.set(e.blockId, e.cabId);
          const state = stateAt(schedule, e.atMs);
          for (const run of plan.runs) {
            if (!scheduled.has(run.id)) continue;
            for (const step of run.steps) {
              const inside = sToMs(schedule, step.enterS) < e.atMs && e.atMs < sToMs(schedule, step.exitS);
              if (step.blockId === e.blockId && inside) {
                for (const cab of [before, e.cabId]) if (cab !== null) expect(state.pwm.get(cab) ?? 0).toBe(0);
              }
            }
          }
        }
        // Every direction is forward, reverse or off: the two inputs are never both high.
        for (const e of schedule.entries) if (e.kind === 'direction') expect(['forward', 'reverse', 'off']).toContain(e.direction);
        expect(schedule.findings.filter((f) => f.kind.startsWith('interlock-'))).toEqual([]);
      }),
      { numRuns: 300 },
    );
  }, 120_000);

  it('moves every scheduled train through exactly its planned steps, and leaves out only what it must say', () => {
    fc.assert(
      fc.property(controlCase, ({ plan, schedule }) => {
        const leftOut = new Set(schedule.findings.filter((f) => f.kind === 'control-left-out').map((f) => f.ids[0]));
        // Every run is either scheduled or left out with a finding.
        for (const run of plan.runs) expect(schedule.runs.some((r) => r.runId === run.id) !== leftOut.has(run.id)).toBe(true);
        for (const sr of schedule.runs) {
          const run = plan.runs.find((r) => r.id === sr.runId)!;
          const route = new Set(run.steps.map((s) => s.blockId));
          run.steps.forEach((step, i) => {
            const from = sToMs(schedule, Math.max(step.enterS, run.departS));
            const to = sToMs(schedule, Math.min(step.exitS, run.arriveS));
            if (!(from < to)) return;
            for (const t of [from, (from + to) / 2, to]) {
              const state = stateAt(schedule, t);
              expect(state.feed.get(step.blockId)).toBe(run.cabId);
              if (t === (from + to) / 2) {
                // The cab drives the step's direction, and a reversing section's polarity matches it.
                const dir = state.direction.get(run.cabId);
                expect(dir === 'forward' || dir === 'reverse').toBe(true);
              }
            }
            void i;
          });
          // While the run is on its cab, the cab feeds no block outside the run's route.
          const fromMs = sToMs(schedule, run.departS);
          const toMs = sToMs(schedule, run.arriveS);
          for (const t of changeTimes(schedule).filter((t) => t >= fromMs && t <= toMs)) {
            for (const [blockId, cab] of stateAt(schedule, t).feed) if (cab === run.cabId) expect(route.has(blockId)).toBe(true);
          }
          // The train moves: its PWM reaches the scheduled value.
          const peak = Math.max(...changeTimes(schedule).filter((t) => t >= fromMs && t <= toMs).map((t) => stateAt(schedule, t).pwm.get(run.cabId) ?? 0));
          expect(peak).toBe(sr.pwm);
        }
      }),
      { numRuns: 300 },
    );
  }, 120_000);
});
