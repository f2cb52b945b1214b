// npm run demo — Fishplate with the demo railway on SQLite and the local mail catcher, on a fresh
// machine: applies migrations, seeds the demo railway into an empty database, builds once, starts.
import { spawnSync, spawn } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const port = process.env.PORT ?? '3000';
const secretFile = path.join('data', '.demo-secret');
fs.mkdirSync('data', { recursive: true });
if (!process.env.NEXTAUTH_SECRET && !fs.existsSync(secretFile)) {
  fs.writeFileSync(secretFile, crypto.randomBytes(32).toString('base64url'), { mode: 0o600 });
}
const env = {
  ...process.env,
  DATABASE_URL: process.env.DATABASE_URL ?? 'data/fishplate.db',
  NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? fs.readFileSync(secretFile, 'utf8').trim(),
  NEXTAUTH_URL: process.env.NEXTAUTH_URL ?? `http://localhost:${port}`,
  PORT: port,
  FISHPLATE_DEMO: '1',
  NEXT_TELEMETRY_DISABLED: '1',
};

function step(command, args) {
  const status = spawnSync(command, args, { stdio: 'inherit', env }).status;
  if (status !== 0) process.exit(status ?? 1);
}

/** True when a source file is newer than the last build (after a git pull, say). */
function buildIsStale() {
  if (!fs.existsSync('.next/BUILD_ID')) return true;
  const built = fs.statSync('.next/BUILD_ID').mtimeMs;
  const newer = (dir) =>
    fs.readdirSync(dir, { withFileTypes: true }).some((entry) => {
      const full = path.join(dir, entry.name);
      return entry.isDirectory() ? newer(full) : fs.statSync(full).mtimeMs > built;
    });
  return ['app', 'components', 'lib', 'db', 'drizzle'].some((dir) => fs.existsSync(dir) && newer(dir));
}

step('npx', ['tsx', 'lib/cli/seed.ts']);
if (buildIsStale() || process.env.FISHPLATE_REBUILD === '1') {
  console.log('Building Fishplate once (about a minute)…');
  step('npx', ['next', 'build']);
}
console.log(`\nFishplate: ${env.NEXTAUTH_URL}  — sign in as host@, planner@ or operator@fishplate.example, password "demo-railway"\n`);
// Its own process group: npx starts next, which starts the server and the mail catcher. A signal to
// this script goes to the whole group, so SIGTERM (not only Ctrl-C in a terminal) frees ports 3000 and 2525.
const server = spawn('npx', ['next', 'start', '-p', port], { stdio: 'inherit', env, detached: true });
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(signal, () => {
    try {
      process.kill(-server.pid, signal);
    } catch {
      // The group is gone already.
    }
  });
}
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
