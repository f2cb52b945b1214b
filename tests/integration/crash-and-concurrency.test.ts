import { spawn, type ChildProcess } from 'node:child_process';
import Database from 'better-sqlite3';
import { eq, like } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { databasePath, getDb } from '@/db';
import { requeueInterruptedMail } from '@/db/queries/outbox';
import { caughtMail, outbox } from '@/db/schema';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { deliverDueMail } from '@/lib/mail/outbox';
import { closeTransport } from '@/lib/mail/transport';

function startProcess(script: string, args: string[], env: Record<string, string> = {}): { child: ChildProcess; lines: string[]; lineCount: (n: number) => Promise<void> } {
  const child = spawn(process.execPath, ['--import', 'tsx', '--conditions=react-server', script, ...args], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
  });
  const lines: string[] = [];
  const waiting: { n: number; resolve: () => void }[] = [];
  let partial = '';
  child.stdout!.on('data', (chunk: Buffer) => {
    const text = partial + chunk.toString();
    const parts = text.split('\n');
    partial = parts.pop() ?? '';
    lines.push(...parts);
    for (const w of waiting.filter((x) => lines.length >= x.n)) w.resolve();
  });
  child.stderr!.on('data', (chunk: Buffer) => process.stderr.write(chunk));
  // Resolves when the process has printed `n` lines: an event, not a deadline (the test's timeout only catches a hang).
  const lineCount = (n: number) => (lines.length >= n ? Promise.resolve() : new Promise<void>((resolve) => waiting.push({ n, resolve })));
  return { child, lines, lineCount };
}

const exited = (child: ChildProcess) => new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
/** Waits until `check` holds, however long that takes on this machine (the test's timeout only catches a hang). */
const until = async (check: () => boolean) => {
  while (!check()) await new Promise((r) => setTimeout(r, 10));
};
const HANG_GUARD_MS = 10 * 60_000;

let server: Awaited<ReturnType<typeof startLocalMailServer>>;
beforeAll(async () => {
  getDb(); // migrations applied before any child opens the file
  server = await startLocalMailServer(0);
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
});
afterAll(async () => {
  closeTransport();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

describe('crash safety', () => {
  it('SIGKILL in the middle of a stream of writes: the file is intact and every acknowledged write is there', async () => {
    const { child, lines, lineCount } = startProcess('tests/integration/processes/writer.ts', ['kill']);
    await lineCount(300);
    child.kill('SIGKILL');
    await exited(child);
    const acknowledged = lines.filter((l) => l.startsWith('kill-'));
    const file = new Database(databasePath(), { readonly: true });
    expect(file.pragma('integrity_check', { simple: true })).toBe('ok'); // SQLite PRAGMA integrity_check
    const stored = new Set(
      (file.prepare("select entity_id from audit_log where entity_id like 'kill-%'").all() as { entity_id: string }[]).map((r) => r.entity_id),
    );
    file.close();
    expect(acknowledged.length).toBeGreaterThanOrEqual(300);
    for (const id of acknowledged) expect(stored.has(id), id).toBe(true);
  }, HANG_GUARD_MS);

  it('SIGKILL in the middle of an invitation batch: after a restart every invitation is delivered exactly once', async () => {
    const { child, lines } = startProcess('tests/integration/processes/mailer.ts', ['60']);
    await until(() => lines.includes('queued'));
    const caughtCount = () => getDb().select().from(caughtMail).where(like(caughtMail.subject, 'Invitation %')).all().length;
    await until(() => caughtCount() >= 10);
    child.kill('SIGKILL');
    await exited(child);
    const atKill = caughtCount();
    expect(atKill).toBeLessThan(60); // it really died mid-batch

    // What the restarted server does at start, then its worker.
    requeueInterruptedMail();
    for (;;) {
      const { sent, failed } = await deliverDueMail();
      expect(failed).toBe(0);
      if (sent === 0) break;
    }
    const rows = getDb().select().from(outbox).where(like(outbox.dedupeKey, 'crash-batch:%')).all();
    expect(rows).toHaveLength(60);
    expect(rows.every((r) => r.status === 'sent')).toBe(true);
    const subjects = getDb().select().from(caughtMail).where(like(caughtMail.subject, 'Invitation %')).all().map((m) => m.subject);
    expect(subjects).toHaveLength(60);
    expect(new Set(subjects).size).toBe(60);
    void eq;
  }, HANG_GUARD_MS);
});

describe('concurrency', () => {
  it('twenty processes writing to the one SQLite file at once: every write lands, none sees "database is locked"', async () => {
    // Every writer opens the database and says "ready"; all start writing together only then, so
    // they really write at once however long a busy machine takes to start twenty processes.
    const writers = Array.from({ length: 20 }, (_, i) => startProcess('tests/integration/processes/writer.ts', [`par${i}`, '100', 'wait']));
    await Promise.all(writers.map((w) => new Promise((resolve) => w.child.once('message', resolve))));
    const codes = Promise.all(writers.map((w) => exited(w.child)));
    for (const w of writers) w.child.send('go');
    const exitCodes = await codes;
    expect(exitCodes.every((c) => c === 0)).toBe(true);
    const file = new Database(databasePath(), { readonly: true });
    const n = (file.prepare("select count(*) n from audit_log where entity_id like 'par%'").get() as { n: number }).n;
    file.close();
    expect(n).toBe(20 * 100);
    expect(writers.reduce((sum, w) => sum + w.lines.length, 0)).toBe(2000);
  }, HANG_GUARD_MS);
});
