// npm run bench:http — drives the production build on loopback with autocannon and compares it with
// a bare Node http server answering from the same SQLite file. `--smoke` is the short CI version
// (it fails on any error). All traffic goes to 127.0.0.1 and every run is bounded in time.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import autocannon from 'autocannon';
import Database from 'better-sqlite3';

const smoke = process.argv.includes('--smoke');
const DURATION_S = smoke ? 2 : 20;
const CONNECTIONS = smoke ? 10 : 50;
// BENCH_PORT moves the servers so that two checkouts can benchmark side by side.
const PORT = Number(process.env.BENCH_PORT ?? 3610);
const BARE_PORT = PORT + 10;
const BASE = `http://127.0.0.1:${PORT}`;
const DB = `data/bench-${PORT}.db`;
const distDir = process.env.NEXT_DIST_DIR ?? '.next';
const env = {
  ...process.env,
  DATABASE_URL: DB,
  NEXTAUTH_URL: BASE,
  NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? 'bench-secret-not-for-production-0123456789',
  LOCAL_SMTP_PORT: String(PORT + 1),
  NEXT_TELEMETRY_DISABLED: '1',
  FISHPLATE_OUTBOX_WORKER: 'off',
};

function must(status: number | null, what: string) {
  if (status !== 0) throw new Error(`${what} failed`);
}

async function waitFor(url: string, timeoutMs = 60_000) {
  const start = Date.now();
  for (;;) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      /* not up yet */
    }
    if (Date.now() - start > timeoutMs) throw new Error(`${url} did not come up`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** Signs in through next-auth's credentials flow and returns the session cookie. */
async function signIn(email: string): Promise<string> {
  const csrfResponse = await fetch(`${BASE}/api/auth/csrf`);
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const csrfCookie = csrfResponse.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const response = await fetch(`${BASE}/api/auth/callback/password`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: csrfCookie },
    body: new URLSearchParams({ csrfToken, email, password: 'demo-railway', json: 'true' }),
  });
  const session = response.headers.getSetCookie().find((c) => c.includes('session-token'));
  if (!session) throw new Error(`could not sign in as ${email}`);
  return session.split(';')[0]!;
}

type Row = { name: string; rps: number; p50: number; p99: number; errors: number; non2xx: number; requests: number };

async function drive(name: string, url: string, cookie?: string): Promise<Row> {
  const result = await autocannon({
    url,
    connections: CONNECTIONS,
    duration: DURATION_S,
    headers: cookie ? { cookie } : {},
  });
  return {
    name,
    rps: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
    requests: result.requests.total,
  };
}

let server: ChildProcess | undefined;
let bare: http.Server | undefined;
try {
  try {
    await fetch(`${BASE}/api/health`);
    throw new Error(`Something already answers on port ${PORT}: stop it first.`);
  } catch (error) {
    if (error instanceof Error && error.message.startsWith('Something')) throw error;
  }
  if (!fs.existsSync(`${distDir}/BUILD_ID`)) must(spawnSync('npx', ['next', 'build'], { stdio: 'inherit', env }).status, 'next build');
  for (const suffix of ['', '-wal', '-shm']) fs.rmSync(DB + suffix, { force: true });
  must(spawnSync('npx', ['tsx', 'lib/cli/seed.ts', '--large-session'], { stdio: 'inherit', env }).status, 'seed');

  const sqlite = new Database(DB, { readonly: true });
  const sessions = sqlite.prepare('select id, title from sessions order by starts_at').all() as { id: string; title: string }[];
  const demo = sessions.find((s) => s.title === 'December running evening')!;
  const large = sessions.find((s) => s.title.startsWith('Marathon'))!;

  // Its own process group, so that stopping it also stops the next-server child that npx starts.
  server = spawn('npx', ['next', 'start', '-p', String(PORT)], { env, stdio: ['ignore', 'ignore', 'inherit'], detached: true });
  await waitFor(`${BASE}/api/health`);
  const planner = await signIn('planner@fishplate.example');
  const operator = await signIn('operator@fishplate.example');

  // The same question answered by a bare Node server: one SQLite row as JSON.
  const row = sqlite.prepare('select id, title, starts_at, status from sessions where id = ?');
  bare = http.createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify(row.get(demo.id)));
  });
  await new Promise<void>((resolve) => bare!.listen(BARE_PORT, '127.0.0.1', resolve));

  const targets: [string, string, string | undefined][] = [
    ['health', `${BASE}/api/health`, undefined],
    ["operator's sessions (GET /api/sessions)", `${BASE}/api/sessions`, operator],
    ['demo session check (20 runs)', `${BASE}/api/sessions/${demo.id}/check`, planner],
    ['large session check (200 runs)', `${BASE}/api/sessions/${large.id}/check`, planner],
    ['bare Node http + same SQLite row', `http://127.0.0.1:${BARE_PORT}/`, undefined],
  ];
  const rows: Row[] = [];
  for (const [name, url, cookie] of targets) {
    const probe = await fetch(url, { headers: cookie ? { cookie } : {} });
    if (probe.status !== 200) {
      console.log(`skip ${name}: ${url} answers ${probe.status}`);
      rows.push({ name, rps: 0, p50: 0, p99: 0, errors: 0, non2xx: 1, requests: 0 });
      continue;
    }
    rows.push(await drive(name, url, cookie));
  }
  sqlite.close();

  const bareRow = rows.at(-1)!;
  console.log(`\n${CONNECTIONS} connections, ${DURATION_S} s per endpoint, loopback\n`);
  console.log('| endpoint | req/s | p50 ms | p99 ms | errors | non-2xx | × bare req/s |');
  console.log('|---|---|---|---|---|---|---|');
  for (const r of rows) {
    const ratio = bareRow.rps > 0 && r.rps > 0 ? (bareRow.rps / r.rps).toFixed(1) : '—';
    console.log(`| ${r.name} | ${Math.round(r.rps)} | ${r.p50} | ${r.p99} | ${r.errors} | ${r.non2xx} | ${ratio} |`);
  }
  const bad = rows.filter((r) => r.errors > 0 || r.non2xx > 0);
  if (bad.length) {
    console.log(`\nFAILED: ${bad.map((r) => r.name).join(', ')} had errors or non-2xx answers`);
    process.exitCode = 1;
  }
} finally {
  bare?.close();
  if (server?.pid) process.kill(-server.pid, 'SIGTERM');
}
