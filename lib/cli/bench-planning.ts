/**
 * Times the planning engine on synthetic plans of about 6k, 60k and 600k steps, next to the time
 * of sorting the same steps by enterS in the same process. Run with `npm run bench`.
 *
 * The layout: many loops of 24 blocks, each with four stations and three trains that take turns
 * to move one station on into the free one (seven blocks a run), every loop with its own two cabs
 * and two operators, four loops to a supply. A few runs leave early, which makes real clashes:
 * block overlaps, double-booked cabs and operators, and supply loads over the derate line.
 */
import { performance } from 'node:perf_hooks';
import {
  checkPlan,
  driverFromPreset,
  FINDING_LIMITS,
  DRIVER_PRESETS,
  planSchema,
  suggestRetime,
  timeRun,
  toPlanJson,
  type Plan,
} from '@/lib/planning';
import { identicalRunsPlan } from './identical-runs-plan';

const BLOCKS_PER_LOOP = 24;
const STATION_SPACING = 6;
const RUNS_PER_LOOP = 40;
const SLOT_S = 120;
const EARLY_SHARE = 0.03;

/** Small deterministic generator (mulberry32), so every bench run builds the same plans. */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function buildPlan(targetSteps: number, seed: number): Plan {
  const rand = random(seed);
  const stepsPerRun = STATION_SPACING + 1;
  const loops = Math.max(1, Math.round(targetSteps / (stepsPerRun * RUNS_PER_LOOP)));
  const preset = DRIVER_PRESETS.find((p) => p.id === 'mosfet-dual-low-voltage-1-2a')!;
  const plan: Plan = {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [],
    drivers: [],
    cabs: [],
    blocks: [],
    links: [],
    locomotives: [],
    trains: [],
    operators: [],
    runs: [],
  };

  for (let loop = 0; loop < loops; loop++) {
    const p = `L${loop}-`;
    if (loop % 4 === 0) plan.supplies.push({ id: `S${loop / 4}`, name: `Supply ${loop / 4}`, volts: 12.6, amps: 4 });
    plan.drivers.push(driverFromPreset(preset, { id: `${p}D`, supplyId: `S${Math.floor(loop / 4)}` }));
    for (const channel of [1, 2]) {
      plan.cabs.push({ id: `${p}C${channel}`, name: `Cab ${channel}`, driverId: `${p}D`, channel });
      plan.operators.push({ id: `${p}O${channel}`, name: `Operator ${channel}` });
    }
    const loopBlocks: { id: string; lengthMm: number }[] = [];
    for (let b = 0; b < BLOCKS_PER_LOOP; b++) {
      const station = b % STATION_SPACING === 0;
      const block = { id: `${p}B${b}`, name: `Block ${b}`, lengthMm: station ? 2500 : 1200 + Math.floor(rand() * 1300) };
      loopBlocks.push(block);
      plan.blocks.push(block);
      plan.links.push({ a: block.id, b: `${p}B${(b + 1) % BLOCKS_PER_LOOP}` });
    }
    // Three trains in stations 0, 1 and 2 (of four); station 3 is free.
    const at: number[] = [0, 1, 2];
    for (let t = 0; t < 3; t++) {
      for (const n of [0, 1]) {
        plan.locomotives.push({ id: `${p}T${t}-L${n}`, name: `Loco ${n}`, runningAmps: 0.4, stallAmps: 0.9, ratedVolts: 12 });
      }
      plan.trains.push({ id: `${p}T${t}`, name: `Train ${t}`, locomotiveIds: [`${p}T${t}-L0`, `${p}T${t}-L1`], lightingAmps: 0.1, lengthMm: 1000 });
    }
    const offset = rand() * SLOT_S;
    let free = 3;
    for (let slot = 0; slot < RUNS_PER_LOOP; slot++) {
      // The train just behind the free station moves into it.
      const fromStation = (free + 3) % 4;
      const train = at.indexOf(fromStation);
      const route: string[] = [];
      for (let k = 0; k <= STATION_SPACING; k++) {
        route.push(`${p}B${(fromStation * STATION_SPACING + k) % BLOCKS_PER_LOOP}`);
      }
      const early = rand() < EARLY_SHARE ? 90 + rand() * 180 : 0;
      const timed = timeRun({
        blocks: loopBlocks,
        scaleRatio: 87,
        trainLengthMm: 1000,
        route,
        departS: offset + slot * SLOT_S - early,
        speedKmh: 60 + rand() * 30,
      });
      const crew = (slot % 2) + 1;
      plan.runs.push({ id: `${p}R${slot}`, trainId: `${p}T${train}`, cabId: `${p}C${crew}`, operatorId: `${p}O${crew}`, ...timed });
      at[train] = free;
      free = fromStation;
    }
  }
  // Plans are edited in any order; shuffle so nothing arrives presorted.
  for (let i = plan.runs.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [plan.runs[i], plan.runs[j]] = [plan.runs[j]!, plan.runs[i]!];
  }
  return plan;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

function time(reps: number, work: () => unknown): number {
  const times: number[] = [];
  for (let i = 0; i < reps; i++) {
    const start = performance.now();
    work();
    times.push(performance.now() - start);
  }
  return median(times);
}

const peakMb = () => Math.round(process.resourceUsage().maxRSS / 1024);
const ms = (value: number) => `${value.toFixed(1).padStart(8)} ms`;

const results: { steps: number; check: number; sort: number }[] = [];
for (const [target, reps] of [
  [6_000, 7],
  [60_000, 5],
  [600_000, 2],
] as const) {
  const plan = buildPlan(target, target);
  const steps = plan.runs.reduce((sum, run) => sum + run.steps.length, 0);
  if (target <= 60_000) {
    const parsed = planSchema.safeParse(toPlanJson(plan));
    if (!parsed.success) throw new Error(`bench plan is invalid: ${parsed.error.issues[0]?.message}`);
  }
  const allSteps = plan.runs.flatMap((run) => run.steps);
  const sort = time(reps, () => [...allSteps].sort((a, b) => a.enterS - b.enterS));
  let findings = 0;
  const check = time(reps, () => {
    findings = checkPlan(plan).findings.length;
  });
  let moved = 0;
  let delay = 0;
  const retime = time(Math.max(1, reps - 2), () => {
    const retimes = suggestRetime(plan);
    moved = retimes.length;
    delay = retimes.reduce((sum, r) => sum + r.delayS, 0);
  });
  const baselineDelay = suggestRetime(plan, { strategy: 'baseline' }).reduce((sum, r) => sum + r.delayS, 0);
  results.push({ steps, check, sort });
  console.log(
    `${String(steps).padStart(7)} steps, ${String(plan.runs.length).padStart(6)} runs, ${String(plan.blocks.length).padStart(6)} blocks | ` +
      `sort ${ms(sort)} | checkPlan ${ms(check)} (${(check / sort).toFixed(1)}× sort, ${findings} findings) | ` +
      `suggestRetime ${ms(retime)} (${(retime / sort).toFixed(1)}× sort, ${moved} runs moved, ${Math.round(delay)} s in all; baseline ${Math.round(baselineDelay)} s) | peak RSS ${peakMb()} MB`,
  );
}
const [small, medium] = results;
if (small !== undefined && medium !== undefined) {
  console.log(`checkPlan growth 6k → 60k: ${(medium.check / small.check).toFixed(1)}× (target ≤ 15×)`);
  console.log(`checkPlan at 60k: ${(medium.check / medium.sort).toFixed(1)}× the sort (target < 10×)`);
}
console.log(`peak RSS: ${peakMb()} MB (target for 600k: within 1024 MB)`);

// Issue 10 finding 3: the plan of 1,000 identical runs (every pair clashes in every block and on cab,
// operator and train: about 3 million clashes). Counted in full, listed up to the caps.
const IDENTICAL_BOUND_MS = 500;
const identical = identicalRunsPlan(1000);
let counted = 0;
const identicalMs = time(5, () => {
  const check = checkPlan(identical);
  counted = Object.values(check.counts).reduce((a, b) => a + b, 0);
});
console.log(
  `1,000 identical runs: checkPlan ${ms(identicalMs)} for ${counted} findings counted, ${FINDING_LIMITS.total} listed ` +
    `(bound ${IDENTICAL_BOUND_MS} ms: ${identicalMs <= IDENTICAL_BOUND_MS ? 'within' : 'OVER'})`,
);
