// npm run bench:live — 60 open event streams (board screens and phones) on the production build
// while 10 reporters post a report every few seconds for 5 minutes (`--smoke`: 20 s). Checks that
// every stream receives every event in order, measures report → delivery (p50/p99) and samples
// the server's memory. All traffic is on 127.0.0.1; every wait is bounded.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import Database from 'better-sqlite3';
import { benchServerEnv, signIn as signInAt, waitFor } from './bench-server';

const smoke = process.argv.includes('--smoke');
const DURATION_S = Number(process.env.BENCH_LIVE_SECONDS ?? (smoke ? 20 : 300));
const STREAMS = 60;
const REPORTERS = 10;
const REPORT_EVERY_MS = 3000;
const PORT = Number(process.env.BENCH_PORT ?? 3610);
const BASE = `http://127.0.0.1:${PORT}`;
const DB = `data/bench-live-${PORT}.db`;
const distDir = process.env.NEXT_DIST_DIR ?? '.next';
const env = benchServerEnv(PORT, DB);

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const signIn = (email: string) => signInAt(BASE, email);

/** One open stream: the event numbers it received, in order, and when. */
type Client = { seqs: number[]; at: Map<number, number>; request: http.ClientRequest; errors: number };

function openStream(path: string, cookie: string): Promise<Client> {
  return new Promise((resolve, reject) => {
    const client = { seqs: [] as number[], at: new Map<number, number>(), errors: 0 } as Client;
    let buffer = '';
    client.request = http.get(`${BASE}${path}`, { headers: { cookie, accept: 'text/event-stream' } }, (res) => {
      if (res.statusCode !== 200) return reject(new Error(`stream answered ${res.statusCode}`));
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => {
        const now = performance.now();
        buffer += chunk;
        let end: number;
        while ((end = buffer.indexOf('\n\n')) >= 0) {
          const frame = buffer.slice(0, end);
          buffer = buffer.slice(end + 2);
          // Only the number is needed: read it from the front of the data line, not the whole state.
          const match = /^data: \{"seq":(\d+),"type":"(\w+)"/m.exec(frame);
          if (!match || match[2] === 'hello') continue;
          const seq = Number(match[1]);
          client.seqs.push(seq);
          client.at.set(seq, now);
        }
      });
      res.on('error', () => client.errors++);
      resolve(client);
    });
    client.request.on('error', (e) => (client.errors++, reject(e)));
  });
}

/** Resident memory of the server's processes (the npx wrapper and next-server), in MB. */
function serverRssMb(pgid: number): number {
  const out = spawnSync('ps', ['-o', 'rss=', '-g', String(pgid)], { encoding: 'utf8' }).stdout;
  return Math.round(out.split('\n').filter(Boolean).map(Number).reduce((a, b) => Math.max(a, b), 0) / 1024);
}

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;

let server: ChildProcess | undefined;
try {
  try {
    await fetch(`${BASE}/api/health`);
    throw new Error(`Something already answers on port ${PORT}: stop it first.`);
  } catch (error) {
    if (error instanceof Error && error.message.startsWith('Something')) throw error;
  }
  if (!fs.existsSync(`${distDir}/BUILD_ID`)) spawnSync('npx', ['next', 'build'], { stdio: 'inherit', env });
  for (const suffix of ['', '-wal', '-shm']) fs.rmSync(DB + suffix, { force: true });
  if (spawnSync('npx', ['tsx', 'lib/cli/seed.ts'], { stdio: 'inherit', env }).status !== 0) throw new Error('seed failed');
  const sqlite = new Database(DB, { readonly: true });
  const demo = sqlite.prepare("select id from sessions where title = 'December running evening'").get() as { id: string };
  const runIds = (sqlite.prepare('select id from runs where session_id = ? order by depart_s').all(demo.id) as { id: string }[]).map((r) => r.id);
  sqlite.close();

  server = spawn('npx', ['next', 'start', '-p', String(PORT)], { env, stdio: ['ignore', 'ignore', 'inherit'], detached: true });
  await waitFor(`${BASE}/api/health`);
  const host = await signIn('host@fishplate.example');
  const readers = [host, await signIn('planner@fishplate.example')];
  for (const name of ['operator', 'priya', 'bram', 'sasha', 'tomas', 'wren']) readers.push(await signIn(`${name}@fishplate.example`));
  const post = (path: string, body: unknown) =>
    fetch(`${BASE}${path}`, { method: 'POST', headers: { cookie: host, 'content-type': 'application/json' }, body: JSON.stringify(body) });
  if (!(await post(`/api/sessions/${demo.id}/clock`, { action: 'start' })).ok) throw new Error('could not start the clock');

  // Warm the route once, then open the streams: boards and phones of every role that may read.
  await fetch(`${BASE}/api/sessions/${demo.id}/live?after=0`, { headers: { cookie: host } });
  const clients: Client[] = [];
  for (let i = 0; i < STREAMS; i++) clients.push(await openStream(`/api/sessions/${demo.id}/live`, readers[i % readers.length]!));
  await sleep(1000);
  const pgid = server.pid!;
  const memory: { t: number; mb: number }[] = [{ t: 0, mb: serverRssMb(pgid) }];

  // Ten reporters, each on its own two runs: departed, then withdrawn, then departed again — every
  // report is a valid one and makes one numbered event. (The host may report for anyone.)
  const sentAt = new Map<number, number>();
  const failures: string[] = [];
  const started = performance.now();
  const endAt = started + DURATION_S * 1000;
  const reporters = Array.from({ length: REPORTERS }, async (_, r) => {
    const mine = [runIds[r * 2]!, runIds[r * 2 + 1]!];
    const departed = new Set<string>();
    await sleep((REPORT_EVERY_MS / REPORTERS) * r);
    for (let n = 0; performance.now() < endAt; n++) {
      const runId = mine[n % 2]!;
      const body = departed.has(runId) ? { kind: 'departed', withdraw: true } : { kind: 'departed' };
      const t = performance.now();
      const res = await post(`/api/sessions/${demo.id}/runs/${runId}/reports`, body);
      const text = await res.text();
      if (res.status !== 201) failures.push(`${res.status} ${text.slice(0, 120)}`);
      else {
        sentAt.set(Number(/"seq":(\d+)/.exec(text)![1]), t);
        if (departed.has(runId)) departed.delete(runId);
        else departed.add(runId);
      }
      await sleep(Math.max(0, REPORT_EVERY_MS - (performance.now() - t)) * (0.8 + Math.random() * 0.4));
    }
  });
  const sampler = setInterval(() => memory.push({ t: Math.round((performance.now() - started) / 1000), mb: serverRssMb(pgid) }), 10_000);
  await Promise.all(reporters);
  clearInterval(sampler);
  // Give the last events a bounded moment to arrive.
  const last = Math.max(...sentAt.keys());
  const deadline = performance.now() + 10_000;
  while (performance.now() < deadline && clients.some((c) => !c.at.has(last))) await sleep(100);
  memory.push({ t: Math.round((performance.now() - started) / 1000), mb: serverRssMb(pgid) });
  for (const c of clients) c.request.destroy();

  const expected = [...sentAt.keys()].sort((a, b) => a - b);
  let missing = 0;
  let outOfOrder = 0;
  const latencies: number[] = [];
  for (const c of clients) {
    for (let i = 1; i < c.seqs.length; i++) if (c.seqs[i]! <= c.seqs[i - 1]!) outOfOrder++;
    for (const seq of expected) {
      const got = c.at.get(seq);
      if (got === undefined) missing++;
      else latencies.push(got - sentAt.get(seq)!);
    }
  }
  latencies.sort((a, b) => a - b);
  const firstMinute = memory.filter((m) => m.t <= 60).map((m) => m.mb);
  const lastMinute = memory.filter((m) => m.t >= memory.at(-1)!.t - 60).map((m) => m.mb);
  const mean = (xs: number[]) => Math.round(xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length));
  console.log(`\n${STREAMS} streams, ${REPORTERS} reporters every ~${REPORT_EVERY_MS / 1000} s, ${DURATION_S} s, loopback\n`);
  console.log('| reports | deliveries | missing | out of order | report errors | p50 ms | p99 ms | max ms | server RSS first min → last min (MB) |');
  console.log('|---|---|---|---|---|---|---|---|---|');
  console.log(
    `| ${expected.length} | ${latencies.length} | ${missing} | ${outOfOrder} | ${failures.length} | ${Math.round(percentile(latencies, 50))} | ${Math.round(percentile(latencies, 99))} | ${Math.round(latencies.at(-1) ?? NaN)} | ${mean(firstMinute)} → ${mean(lastMinute)} |`,
  );
  console.log(`memory samples (s: MB): ${memory.map((m) => `${m.t}: ${m.mb}`).join(', ')}`);
  if (failures.length) console.log(`first failures: ${failures.slice(0, 3).join(' / ')}`);
  if (missing || outOfOrder || failures.length || !expected.length) {
    console.log('\nFAILED: not every stream received every event in order');
    process.exitCode = 1;
  }
} finally {
  if (server?.pid) process.kill(-server.pid, 'SIGTERM');
}
