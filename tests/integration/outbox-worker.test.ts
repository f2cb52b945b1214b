import path from 'node:path';
import { eq } from 'drizzle-orm';
import { SMTPServer } from 'smtp-server';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { closeDb, getDb } from '@/db';
import { outbox } from '@/db/schema';
import { enqueueMail, startOutboxWorker } from '@/lib/mail/outbox';
import { closeTransport } from '@/lib/mail/transport';

// The outbox worker (startOutboxWorker) on vitest's fake setInterval: the test moves its clock, so no
// test waits on real time. The SMTP traffic stays real: a server here holds each message's DATA reply
// until the test lets it go, so "a delivery still in flight" is a state the test controls.

const arrived: string[] = [];
let release: () => void = () => undefined;
let held: Promise<void> = Promise.resolve();
let onArrival: () => void = () => undefined;

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS', 'AUTH'],
  logger: false,
  onData(stream, _session, callback) {
    let raw = '';
    stream.on('data', (chunk: Buffer) => (raw += chunk.toString()));
    stream.on('end', () => {
      arrived.push(/^Subject: (.*)$/m.exec(raw)?.[1]?.trim() ?? '');
      onArrival();
      void held.then(() => callback());
    });
  },
});

const timerHolder = globalThis as unknown as { fishplateOutboxTimer?: NodeJS.Timeout };

function holdDeliveries() {
  held = new Promise((resolve) => (release = resolve));
}

function nextArrival() {
  return new Promise<void>((resolve) => (onArrival = resolve));
}

let counter = 0;
function queue(label: string) {
  const key = `worker-${label}-${(counter += 1)}`;
  expect(enqueueMail({ railwayId: null, dedupeKey: key, kind: 'test', toAddress: 'crew@test.example', subject: key, text: `Body ${key}` })).toBe(true);
  return key;
}

// Real SMTP on a loaded machine can take a while; a fixed wait it is not (vi.waitFor polls for the state).
const WAIT = { timeout: 10_000 };

const statusOf = (key: string) => getDb().select().from(outbox).where(eq(outbox.dedupeKey, key)).get()?.status;

beforeAll(async () => {
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const address = server.server.address();
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(typeof address === 'object' && address ? address.port : 0);
});

beforeEach(() => {
  // Only the interval is faked: SQLite, sockets and promises run as usual.
  vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
  held = Promise.resolve();
  // Messages other tests in this file left queued would be sent on the first tick.
  getDb().update(outbox).set({ status: 'sent' }).where(eq(outbox.status, 'queued')).run();
});

afterEach(() => {
  clearInterval(timerHolder.fishplateOutboxTimer);
  delete timerHolder.fishplateOutboxTimer;
  release();
  vi.useRealTimers();
});

afterAll(async () => {
  closeTransport();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

describe('the outbox worker', () => {
  it('puts back messages a crash left "sending", then delivers on its first tick and not before', async () => {
    const interrupted = queue('interrupted');
    getDb().update(outbox).set({ status: 'sending' }).where(eq(outbox.dedupeKey, interrupted)).run();
    startOutboxWorker();
    // Requeued at start (a process killed mid-send never marked it), before any tick.
    expect(statusOf(interrupted)).toBe('queued');
    expect(vi.getTimerCount()).toBe(1);
    vi.advanceTimersByTime(999);
    expect(statusOf(interrupted)).toBe('queued');
    vi.advanceTimersByTime(1); // the default interval is one second
    expect(statusOf(interrupted)).toBe('sending');
    await vi.waitFor(() => expect(statusOf(interrupted)).toBe('sent'), WAIT);
    expect(arrived).toContain(interrupted);
  });

  it('runs once per process: a second start neither adds a timer nor requeues again', () => {
    startOutboxWorker(5_000);
    const timer = timerHolder.fishplateOutboxTimer;
    const sending = queue('left-sending');
    getDb().update(outbox).set({ status: 'sending' }).where(eq(outbox.dedupeKey, sending)).run();
    startOutboxWorker(5_000);
    expect(timerHolder.fishplateOutboxTimer).toBe(timer);
    expect(vi.getTimerCount()).toBe(1);
    expect(statusOf(sending)).toBe('sending');
  });

  it('does not keep the process alive (its timer is unref’d, Node.js timers API)', () => {
    startOutboxWorker();
    expect(timerHolder.fishplateOutboxTimer?.hasRef()).toBe(false);
  });

  it('takes the interval it is given', () => {
    const key = queue('interval');
    startOutboxWorker(60_000);
    vi.advanceTimersByTime(59_999);
    expect(statusOf(key)).toBe('queued');
    vi.advanceTimersByTime(1);
    expect(statusOf(key)).toBe('sending');
  });

  it('skips a tick while a delivery is still in flight, and ticks again once it is done', async () => {
    holdDeliveries();
    const first = queue('first');
    startOutboxWorker();
    const firstArrives = nextArrival();
    vi.advanceTimersByTime(1_000);
    await firstArrives; // the first message is at the server, its reply held
    const second = queue('second');
    vi.advanceTimersByTime(1_000);
    // A second delivery run would claim the new message at once; the busy worker leaves it queued.
    expect(statusOf(second)).toBe('queued');
    release();
    // The running delivery takes the new message in its next batch.
    await vi.waitFor(() => expect([statusOf(first), statusOf(second)]).toEqual(['sent', 'sent']), WAIT);
    // And once it is done, ticks deliver again.
    const third = queue('third');
    await vi.waitFor(() => {
      vi.advanceTimersByTime(1_000);
      expect(statusOf(third)).toBe('sent');
    }, WAIT);
  });

  it('logs a delivery run that fails (the database unreadable) and carries on with the next tick', async () => {
    const error = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const databaseUrl = process.env.DATABASE_URL!;
    try {
      startOutboxWorker();
      // A directory is no SQLite file: opening it fails, so claiming due mail throws.
      closeDb();
      process.env.DATABASE_URL = path.dirname(databaseUrl);
      vi.advanceTimersByTime(1_000);
      await vi.waitFor(() => expect(error).toHaveBeenCalledWith('outbox worker', expect.any(Error)), WAIT);
      process.env.DATABASE_URL = databaseUrl;
      const key = queue('after-failure');
      await vi.waitFor(() => {
        vi.advanceTimersByTime(1_000);
        expect(statusOf(key)).toBe('sent');
      }, WAIT);
    } finally {
      process.env.DATABASE_URL = databaseUrl;
      error.mockRestore();
    }
  });
});
