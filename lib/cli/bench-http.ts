// npm run bench:http — drives the production build on loopback with autocannon. Each endpoint is
// measured right after the app's own health route, in turn, so its ratio to health compares two
// figures taken under the same machine load (the machine is shared); last, a bare Node http server
// answering from the same SQLite file. Each endpoint's single-request time (one connection, one request
// after another) is measured too. `--smoke` is the short CI version (it fails on any error). All
// traffic goes to 127.0.0.1 and every run is bounded in time.
import http from 'node:http';
import { performance } from 'node:perf_hooks';
import autocannon from 'autocannon';
import Database from 'better-sqlite3';
import { loadAverage, median, printGoals, signIn, startBenchServer, type BenchServer } from './bench-server';

const smoke = process.argv.includes('--smoke');
const DURATION_S = smoke ? 2 : 20;
const CONNECTIONS = smoke ? 10 : 50;
const SINGLE_REQUESTS = smoke ? 3 : 30;
// BENCH_PORT moves the servers so that two checkouts can benchmark side by side.
const PORT = Number(process.env.BENCH_PORT ?? 3610);
const BARE_PORT = PORT + 10;

const CHECK_DEMO = 'demo session check (20 runs)';
const BUILDER_DEMO = 'builder page, demo session (server-rendered HTML)';
const BUILDER_LARGE = 'builder page, 200-run session';

type Row = { name: string; rps: number; p50: number; p99: number; errors: number; non2xx: number; requests: number; singleMs: number; bytes: number; healthRps?: number };

async function drive(name: string, url: string, cookie?: string): Promise<Row> {
  const headers: Record<string, string> = cookie ? { cookie } : {};
  // One request after another on one connection: what a single visitor waits for the answer.
  const single: number[] = [];
  let bytes = 0;
  for (let i = 0; i < SINGLE_REQUESTS + 2; i++) {
    const started = performance.now();
    const response = await fetch(url, { headers });
    bytes = (await response.arrayBuffer()).byteLength;
    if (i >= 2) single.push(performance.now() - started); // two to warm up
  }
  const result = await autocannon({ url, connections: CONNECTIONS, duration: DURATION_S, headers });
  return {
    name,
    rps: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
    requests: result.requests.total,
    singleMs: median(single),
    bytes,
  };
}

let app: BenchServer | undefined;
let bare: http.Server | undefined;
try {
  app = await startBenchServer(PORT);
  const { base } = app;
  const planner = await signIn(base, 'planner@fishplate.example');
  const operator = await signIn(base, 'operator@fishplate.example');

  // The same question answered by a bare Node server: one SQLite row as JSON.
  const sqlite = new Database(app.db, { readonly: true });
  const row = sqlite.prepare('select id, title, starts_at, status from sessions where id = ?');
  const demoId = app.demoId;
  bare = http.createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify(row.get(demoId)));
  });
  await new Promise<void>((resolve) => bare!.listen(BARE_PORT, '127.0.0.1', resolve));

  const health = `${base}/api/health`;
  const targets: [string, string, string | undefined][] = [
    ["operator's sessions (GET /api/sessions)", `${base}/api/sessions`, operator],
    [CHECK_DEMO, `${base}/api/sessions/${app.demoId}/check`, planner],
    ['large session check (200 runs)', `${base}/api/sessions/${app.largeId}/check`, planner],
    [BUILDER_DEMO, `${base}/railways/${app.railwayId}/sessions/${app.demoId}`, planner],
    [BUILDER_LARGE, `${base}/railways/${app.railwayId}/sessions/${app.largeId}`, planner],
  ];
  const loadBefore = loadAverage();
  const rows: Row[] = [];
  for (const [name, url, cookie] of targets) {
    const probe = await fetch(url, { headers: cookie ? { cookie } : {} });
    if (probe.status !== 200) {
      console.log(`skip ${name}: ${url} answers ${probe.status}`);
      rows.push({ name, rps: 0, p50: 0, p99: 0, errors: 0, non2xx: 1, requests: 0, singleMs: 0, bytes: 0 });
      continue;
    }
    // Health first, then the endpoint: the two sides of the ratio under the same load.
    const h = await drive('health', health);
    rows.push(h);
    rows.push({ ...(await drive(name, url, cookie)), healthRps: h.rps });
  }
  rows.push(await drive('bare Node http + same SQLite row', `http://127.0.0.1:${BARE_PORT}/`));
  sqlite.close();

  const bareRow = rows.at(-1)!;
  console.log(`\n${CONNECTIONS} connections, ${DURATION_S} s per endpoint, loopback; each endpoint right after a health run`);
  console.log(`load average (1, 5, 15 min) before: ${loadBefore}, after: ${loadAverage()}\n`);
  console.log('| endpoint | one request ms | answer bytes | req/s | × health req/s (same turn) | p50 ms | p99 ms | errors | non-2xx | bare ÷ endpoint req/s |');
  console.log('|---|---|---|---|---|---|---|---|---|---|');
  for (const r of rows) {
    const vsBare = bareRow.rps > 0 && r.rps > 0 ? (bareRow.rps / r.rps).toFixed(1) : '—';
    const vsHealth = r.healthRps ? (r.rps / r.healthRps).toFixed(2) : '—';
    console.log(
      `| ${r.name} | ${r.singleMs.toFixed(1)} | ${r.bytes} | ${Math.round(r.rps)} | ${vsHealth} | ${r.p50} | ${r.p99} | ${r.errors} | ${r.non2xx} | ${vsBare} |`,
    );
  }
  const named = (name: string) => rows.find((r) => r.name === name);
  const ratio = (r: Row | undefined) => (r?.healthRps ? r.rps / r.healthRps : 0);
  const builder = named(BUILDER_DEMO);
  const builderLarge = named(BUILDER_LARGE);
  const check = named(CHECK_DEMO);
  const kb = (bytes = 0) => `${(bytes / 1024).toFixed(0)} KiB (${bytes.toLocaleString('en-GB')} bytes)`;
  printGoals(
    `README table, server side (${CONNECTIONS} connections, ${DURATION_S} s)`,
    [
      { what: 'builder page, demo session: one request (median of ' + SINGLE_REQUESTS + ')', goal: '≤ 20 ms', figure: `${builder?.singleMs.toFixed(1)} ms`, met: (builder?.singleMs ?? Infinity) <= 20 },
      {
        what: `builder page at ${CONNECTIONS} connections`,
        goal: '≥ 0.08 × health, p99 < 1.5 s',
        figure: `${ratio(builder).toFixed(2)} × health, p99 ${builder?.p99} ms, ${builder?.errors} errors`,
        met: ratio(builder) >= 0.08 && (builder?.p99 ?? Infinity) < 1500 && builder?.errors === 0,
      },
      { what: 'builder page HTML, 20 runs (decoded)', goal: '≤ 60 KB', figure: kb(builder?.bytes), met: (builder?.bytes ?? Infinity) <= 60_000 },
      { what: 'builder page HTML, 200 runs (decoded)', goal: 'grows slowly', figure: kb(builderLarge?.bytes), met: null },
      {
        what: '`GET …/check`, demo session',
        goal: '≥ 0.6 × health, p99 < 150 ms',
        figure: `${ratio(check).toFixed(2)} × health, p99 ${check?.p99} ms; one request ${check?.singleMs.toFixed(1)} ms`,
        met: ratio(check) >= 0.6 && (check?.p99 ?? Infinity) < 150,
      },
    ],
    loadAverage(),
  );
  const bad = rows.filter((r) => r.errors > 0 || r.non2xx > 0);
  if (bad.length) {
    console.log(`\nFAILED: ${bad.map((r) => r.name).join(', ')} had errors or non-2xx answers`);
    process.exitCode = 1;
  }
} finally {
  bare?.close();
  app?.stop();
}
