// npm run bench (second part) — compiling the control schedule for the 200-run session
// (the demo session's twenty runs repeated ten times, 17 real minutes apart), target under 200 ms.
import fs from 'node:fs';
import * as t from '@/db/schema';
import { seedLargeSession } from '@/lib/demo/demo-railway';
import { openDemoBenchDatabase } from './bench-database';

const REPEATS = 25;

async function main() {
  const { db, dir } = openDemoBenchDatabase('fishplate-bench-control-');
  const { sessionId, runCount } = seedLargeSession(db, 10);
  const { sessionControl } = await import('@/lib/sessions/control');
  const { compileSchedule } = await import('@/lib/control');
  const { loadSessionPlan } = await import('@/lib/sessions/timetable');
  const session = db.select().from(t.sessions).all().find((s) => s.id === sessionId)!;
  const control = sessionControl(session);
  const { rows, plan } = loadSessionPlan(session.id);
  const input = {
    plan,
    wiring: control.wiring,
    runSpeedKmh: Object.fromEntries(rows.runs.map((r) => [r.id, r.speedKmh])),
    locomotiveTopSpeedKmh: Object.fromEntries(rows.locomotives.map((l) => [l.id, l.topSpeedKmh])),
  };
  const times: number[] = [];
  let entries = 0;
  for (let i = 0; i < REPEATS; i++) {
    const start = performance.now();
    entries = compileSchedule(input).entries.length;
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)]!;
  const whole: number[] = [];
  for (let i = 0; i < 5; i++) {
    const start = performance.now();
    sessionControl(session);
    whole.push(performance.now() - start);
  }
  whole.sort((a, b) => a - b);
  console.log(
    `Control schedule, ${runCount} runs (${control.schedule.runs.length} scheduled, ${entries} settings): ` +
      `compileSchedule ${median.toFixed(1)} ms median of ${REPEATS} (target < 200 ms); ` +
      `with loading rows and sizing every board ${whole[2]!.toFixed(1)} ms`,
  );
  for (const b of control.boards) console.log(`  ${b.name} (${b.title}): ${b.entries} settings${b.size ? `, ${b.size.advice}` : ''}`);
  db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
