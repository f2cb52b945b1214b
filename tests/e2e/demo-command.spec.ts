import { spawn } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import { expect, test } from './fixtures';

const E2E_PORT = Number(process.env.E2E_PORT ?? 3210);
// Ports beside the browser tests' own (E2E_PORT and E2E_PORT + 1 are taken by their server and mail catcher).
const PORT = E2E_PORT + 20;
const SMTP = E2E_PORT + 21;

function portIsOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host: '127.0.0.1', port });
    socket.once('connect', () => (socket.destroy(), resolve(true)));
    socket.once('error', () => resolve(false));
  });
}

test('npm run demo stops its server and mail catcher on SIGTERM', async () => {
  test.setTimeout(120_000);
  // `npm run demo` builds when there is no build in .next; the browser tests' build must be there.
  test.skip(!fs.existsSync('.next/BUILD_ID') || (process.env.NEXT_DIST_DIR ?? '.next') !== '.next', 'needs the production build in .next');
  const db = `data/demo-sigterm-${PORT}.db`;
  for (const f of [db, `${db}-wal`, `${db}-shm`]) fs.rmSync(f, { force: true });
  const demo = spawn('node', ['lib/cli/demo.mjs'], {
    env: { ...process.env, PORT: String(PORT), LOCAL_SMTP_PORT: String(SMTP), DATABASE_URL: db, FISHPLATE_REBUILD: '0', NEXTAUTH_SECRET: 'demo-sigterm-secret-0123456789abcdef' },
    stdio: 'ignore',
  });
  const exited = new Promise<void>((resolve) => demo.once('exit', () => resolve()));
  await expect.poll(async () => (await fetch(`http://127.0.0.1:${PORT}/api/health`).catch(() => null))?.status ?? 0, { timeout: 90_000 }).toBe(200);
  await expect.poll(() => portIsOpen(SMTP), { timeout: 30_000 }).toBe(true);
  demo.kill('SIGTERM');
  await exited;
  await expect.poll(() => portIsOpen(PORT), { timeout: 15_000 }).toBe(false);
  await expect.poll(() => portIsOpen(SMTP), { timeout: 15_000 }).toBe(false);
});
