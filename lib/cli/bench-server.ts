// Shared by the HTTP and browser benchmarks: a fresh database with the demo railway and the 200-run
// session, the production build started on loopback in its own process group, and next-auth sign-in.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import Database from 'better-sqlite3';

export type BenchServer = {
  base: string;
  db: string;
  env: NodeJS.ProcessEnv;
  /** The demo railway's id, the demo session (20 runs) and the 200-run session. */
  railwayId: string;
  demoId: string;
  largeId: string;
  stop: () => void;
};

function must(status: number | null, what: string) {
  if (status !== 0) throw new Error(`${what} failed`);
}

export async function waitFor(url: string, timeoutMs = 60_000) {
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

/** The environment of a benchmark's production server on 127.0.0.1:PORT with its own database. */
export function benchServerEnv(port: number, db: string) {
  return {
    ...process.env,
    DATABASE_URL: db,
    NEXTAUTH_URL: `http://127.0.0.1:${port}`,
    NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? 'bench-secret-not-for-production-0123456789',
    LOCAL_SMTP_PORT: String(port + 1),
    NEXT_TELEMETRY_DISABLED: '1',
    FISHPLATE_OUTBOX_WORKER: 'off',
  };
}

/**
 * Seeds `data/bench-PORT.db` afresh (demo railway and the 200-run session), builds when there is no
 * build in NEXT_DIST_DIR, and starts `next start` on 127.0.0.1:PORT.
 */
export async function startBenchServer(port: number): Promise<BenchServer> {
  const base = `http://127.0.0.1:${port}`;
  const db = `data/bench-${port}.db`;
  const distDir = process.env.NEXT_DIST_DIR ?? '.next';
  const env = benchServerEnv(port, db);
  try {
    await fetch(`${base}/api/health`);
    throw new Error(`Something already answers on port ${port}: stop it first.`);
  } catch (error) {
    if (error instanceof Error && error.message.startsWith('Something')) throw error;
  }
  if (!fs.existsSync(`${distDir}/BUILD_ID`)) must(spawnSync('npx', ['next', 'build'], { stdio: 'inherit', env }).status, 'next build');
  for (const suffix of ['', '-wal', '-shm']) fs.rmSync(db + suffix, { force: true });
  must(spawnSync('npx', ['tsx', 'lib/cli/seed.ts', '--large-session'], { stdio: 'inherit', env }).status, 'seed');

  const sqlite = new Database(db, { readonly: true });
  const sessions = sqlite.prepare('select id, title, railway_id as railwayId from sessions order by starts_at').all() as { id: string; title: string; railwayId: string }[];
  sqlite.close();
  const demo = sessions.find((s) => s.title === 'December running evening')!;
  const large = sessions.find((s) => s.title.startsWith('Marathon'))!;

  // Its own process group, so that stopping it also stops the next-server child that npx starts.
  const server: ChildProcess = spawn('npx', ['next', 'start', '-p', String(port)], { env, stdio: ['ignore', 'ignore', 'inherit'], detached: true });
  await waitFor(`${base}/api/health`);
  return {
    base,
    db,
    env,
    railwayId: demo.railwayId,
    demoId: demo.id,
    largeId: large.id,
    stop: () => {
      if (server.pid) process.kill(-server.pid, 'SIGTERM');
    },
  };
}

/** Signs in through next-auth's credentials flow and returns the session cookie (`name=value`). */
export async function signIn(base: string, email: string): Promise<string> {
  const csrfResponse = await fetch(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const csrfCookie = csrfResponse.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const response = await fetch(`${base}/api/auth/callback/password`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: csrfCookie },
    body: new URLSearchParams({ csrfToken, email, password: 'demo-railway', json: 'true' }),
  });
  const session = response.headers.getSetCookie().find((c) => c.includes('session-token'));
  if (!session) throw new Error(`could not sign in as ${email}`);
  return session.split(';')[0]!;
}

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

/** The machine's load while measuring (the machine is shared: the figures depend on it). */
export function loadAverage(): string {
  try {
    return fs.readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');
  } catch {
    return 'unknown';
  }
}

/** One row of the README's "Speed where people wait" table: what, the goal, the figure measured now. */
export type GoalRow = { what: string; goal: string; figure: string; met: boolean | null };

/** Prints the goal rows as the README's table does (goal / figure / met?), with the machine's load. */
export function printGoals(title: string, rows: GoalRow[], load: string): void {
  console.log(`\n${title} (load average ${load})\n`);
  console.log('| What | Goal | Now | Met? |');
  console.log('|---|---|---|---|');
  for (const r of rows) console.log(`| ${r.what} | ${r.goal} | ${r.figure} | ${r.met === null ? '—' : r.met ? 'yes' : '**no**'} |`);
}
