/**
 * Times the timetable builder's server side on a 200-run session: what opening the builder costs
 * (load the rows, build the plan, checkPlan) and what one edit costs (write the run, load, check),
 * with the size of the answer. Run with
 *
 *   npx tsx --conditions react-server lib/cli/bench-builder.ts
 *
 * (`react-server` lets the server-only query modules load outside Next). It works on a fresh
 * SQLite file in the system's temp folder with the demo railway seeded.
 */
import fs from 'node:fs';
import { performance } from 'node:perf_hooks';
import { eq } from 'drizzle-orm';
import * as t from '@/db/schema';
import { openDemoBenchDatabase } from './bench-database';
import { median } from './bench-server';
import { checkPlan, suggestRetime } from '@/lib/planning';

const RUNS = Number(process.env.BENCH_RUNS ?? 200);
const REPEATS = 25;

async function main() {
  const { db, dir, demo: seeded } = openDemoBenchDatabase('fishplate-bench-');
  const { sessionId } = seeded;

  const { snapshotOf, loadSessionPlan } = await import('@/lib/sessions/timetable');
  const { assertRunsValid } = await import('@/lib/runs/rules');
  const { shiftTiming } = await import('@/lib/runs/schema');
  const { copySession } = await import('@/db/queries/session-records');
  const { replaceSessionRuns, updateRun, getRun } = await import('@/db/queries/runs');

  // A copy of the demo session with its runs repeated, 17 real minutes apart, up to RUNS runs.
  const source = db.select().from(t.sessions).where(eq(t.sessions.id, sessionId)).get()!;
  const big = copySession(source, 7 * 86_400_000, 'Bench session');
  const demo = loadSessionPlan(sessionId).plan.runs;
  const values = Array.from({ length: RUNS }, (_, i) => {
    const run = demo[i % demo.length]!;
    const shift = Math.floor(i / demo.length) * 1020;
    return { trainId: run.trainId, cabId: run.cabId, operatorId: run.operatorId, speedKmh: null, note: '', ...shiftTiming(run, shift) };
  });
  replaceSessionRuns(big.id, values);

  const open: number[] = [];
  const check: number[] = [];
  let bytes = 0;
  let parts: Record<string, number> = {};
  let findings = 0;
  let steps = 0;
  for (let i = 0; i < REPEATS; i++) {
    const started = performance.now();
    const snapshot = snapshotOf(big.id);
    const body = JSON.stringify(snapshot);
    open.push(performance.now() - started);
    bytes = Buffer.byteLength(body);
    parts = Object.fromEntries(Object.entries(snapshot).map(([k, v]) => [k, Math.round(Buffer.byteLength(JSON.stringify(v)) / 1024)]));
    findings = snapshot.findings.length;
    steps = snapshot.runs.reduce((n, r) => n + r.steps.length, 0);
    const plan = loadSessionPlan(big.id).plan;
    const c = performance.now();
    checkPlan(plan);
    check.push(performance.now() - c);
  }

  const edit: number[] = [];
  const target = snapshotOf(big.id).runs[RUNS >> 1]!.id;
  for (let i = 0; i < REPEATS; i++) {
    const run = getRun(big.id, target)!;
    const delta = i % 2 === 0 ? 60 : -60;
    const started = performance.now();
    // What the PATCH handler does before writing: load the plan and validate the edited run in it.
    const loaded = loadSessionPlan(big.id);
    assertRunsValid(loaded.plan, new Set([target]), loaded.rows.session);
    updateRun(big.id, target, run.version, {
      departS: run.departS + delta,
      arriveS: run.arriveS + delta,
      steps: run.steps.map((s) => ({ ...s, enterS: s.enterS + delta, exitS: s.exitS + delta })),
    });
    JSON.stringify(snapshotOf(big.id));
    edit.push(performance.now() - started);
  }

  const retimeStarted = performance.now();
  const moves = suggestRetime(loadSessionPlan(big.id).plan);
  const retimeMs = performance.now() - retimeStarted;

  const f = (ms: number) => `${ms.toFixed(1)} ms`;
  console.log(`Builder bench: ${RUNS} runs, ${steps} steps, ${findings} findings, answer ${(bytes / 1024).toFixed(0)} KiB (medians of ${REPEATS})`);
  console.log(`  answer parts (KiB): ${JSON.stringify(parts)}`);
  console.log(`  open (load rows + plan + checkPlan + JSON): ${f(median(open))}`);
  console.log(`  checkPlan alone:                           ${f(median(check))}`);
  console.log(`  edit (load + validate + write + load + check + JSON): ${f(median(edit))}`);
  console.log(`  suggestRetime (once):                      ${f(retimeMs)}, ${moves.length} runs moved`);
  db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
}

void main();
