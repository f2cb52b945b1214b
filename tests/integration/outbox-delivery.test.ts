import net from 'node:net';
import { eq, like } from 'drizzle-orm';
import { simpleParser } from 'mailparser';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import { caughtMail, outbox } from '@/db/schema';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { deliverDueMail, enqueueMail, type NewOutboxMessage } from '@/lib/mail/outbox';
import { closeTransport } from '@/lib/mail/transport';

// deliverDueMail (lib/mail/outbox.ts) in the details tests/integration/mail.test.ts leaves out: what goes on
// the wire beside subject and text, batches, and when it gives up.

let server: Awaited<ReturnType<typeof startLocalMailServer>>;
let closedPort: number;

beforeAll(async () => {
  server = await startLocalMailServer(0);
  // A port with nothing listening: take a free one and close it again.
  closedPort = await new Promise<number>((resolve) => {
    const probe = net.createServer().listen(0, '127.0.0.1', () => {
      const port = (probe.address() as net.AddressInfo).port;
      probe.close(() => resolve(port));
    });
  });
});

afterEach(() => {
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
  // Nothing one test leaves queued is sent by the next.
  getDb().update(outbox).set({ status: 'failed' }).where(eq(outbox.status, 'queued')).run();
});

afterAll(async () => {
  closeTransport();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

let counter = 0;
function queue(label: string, extra: Partial<NewOutboxMessage> = {}) {
  const key = `delivery-${label}-${(counter += 1)}`;
  expect(enqueueMail({ railwayId: null, dedupeKey: key, kind: 'test', toAddress: 'crew@test.example', subject: key, text: `Text of ${key}`, ...extra })).toBe(true);
  return key;
}

const rowOf = (key: string) => getDb().select().from(outbox).where(eq(outbox.dedupeKey, key)).get()!;

async function received(key: string) {
  const row = getDb().select().from(caughtMail).where(like(caughtMail.subject, key)).get();
  expect(row, key).toBeDefined();
  return simpleParser(row!.raw);
}

describe('what deliverDueMail puts on the wire', () => {
  it('sends from MAIL_FROM, to the row’s address, text only when the row has no HTML', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
    const key = queue('plain');
    expect(await deliverDueMail()).toEqual({ sent: 1, failed: 0 });
    const mail = await received(key);
    // lib/env.ts default MAIL_FROM (the integration setup does not set it).
    expect(mail.from?.value).toEqual([{ name: 'Fishplate', address: 'no-reply@fishplate.example' }]);
    expect(mail.to && !Array.isArray(mail.to) ? mail.to.value.map((v) => v.address) : []).toEqual(['crew@test.example']);
    expect(mail.html).toBe(false);
    expect(mail.headers.get('content-type')).toMatchObject({ value: 'text/plain' });
  });

  it('adds the HTML as the richer alternative (RFC 2046 5.1.4: multipart/alternative, plain text first)', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
    const key = queue('html', { html: '<p>Rich <b>text</b></p>' });
    await deliverDueMail();
    const mail = await received(key);
    expect(mail.headers.get('content-type')).toMatchObject({ value: 'multipart/alternative' });
    expect(mail.html).toBe('<p>Rich <b>text</b></p>');
    expect(mail.text?.trim()).toBe(`Text of ${key}`);
  });

  it('attaches a calendar object only with its method (RFC 6047 2.4: text/calendar with a method parameter)', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
    const calendar = ['BEGIN:VCALENDAR', 'VERSION:2.0', 'PRODID:-//Test//EN', 'METHOD:REQUEST', 'END:VCALENDAR', ''].join('\r\n');
    const withMethod = queue('calendar', { calendar, calendarMethod: 'REQUEST' });
    const withoutMethod = queue('calendar-no-method', { calendar, calendarMethod: null });
    await deliverDueMail();
    const raw = (key: string) => getDb().select().from(caughtMail).where(like(caughtMail.subject, key)).get()?.raw ?? '';
    expect(raw(withMethod)).toMatch(/^Content-Type: text\/calendar; charset=utf-8; method=REQUEST$/im);
    expect(raw(withoutMethod)).toContain(`Text of ${withoutMethod}`);
    expect(raw(withoutMethod)).not.toMatch(/text\/calendar/i);
  });
});

describe('batches and giving up', () => {
  it('sends everything due, in batches of `limit`', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
    const keys = [1, 2, 3, 4, 5].map((i) => queue(`batch-${i}`));
    expect(await deliverDueMail(2)).toEqual({ sent: 5, failed: 0 });
    for (const key of keys) expect(rowOf(key)).toMatchObject({ status: 'sent', attempts: 1, lastError: null });
    expect(await deliverDueMail(2)).toEqual({ sent: 0, failed: 0 });
  });

  it('stops after a batch with a failure, so a server that is down is not asked once per queued message', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(closedPort);
    const first = queue('down-1');
    const second = queue('down-2');
    expect(await deliverDueMail(1)).toEqual({ sent: 0, failed: 1 });
    expect(rowOf(first)).toMatchObject({ status: 'queued', attempts: 1 });
    expect(rowOf(second)).toMatchObject({ status: 'queued', attempts: 0 });
  });

  it('waits 5 s after a first failure (lib/mail/outbox.ts retryDelayMs) and records the error', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(closedPort);
    const key = queue('backoff');
    const before = Date.now();
    await deliverDueMail();
    const after = Date.now();
    const row = rowOf(key);
    expect(row.lastError).toMatch(/ECONNREFUSED/);
    expect(row.nextAttemptAt.getTime()).toBeGreaterThanOrEqual(before + 5_000);
    expect(row.nextAttemptAt.getTime()).toBeLessThanOrEqual(after + 5_000);
  });

  it('gives up after the eighth attempt: the message is failed, not queued again', async () => {
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(closedPort);
    const seventh = queue('seventh');
    const eighth = queue('eighth');
    // Each claim counts an attempt (db/queries/outbox.ts claimDueMail): these fail their 7th and 8th.
    getDb().update(outbox).set({ attempts: 6 }).where(eq(outbox.dedupeKey, seventh)).run();
    getDb().update(outbox).set({ attempts: 7 }).where(eq(outbox.dedupeKey, eighth)).run();
    expect(await deliverDueMail()).toEqual({ sent: 0, failed: 2 });
    expect(rowOf(seventh)).toMatchObject({ status: 'queued', attempts: 7 });
    // The 7th failure waits 5 s × 2^6 = 320 s.
    expect(rowOf(seventh).nextAttemptAt.getTime()).toBeGreaterThan(Date.now() + 300_000);
    expect(rowOf(eighth)).toMatchObject({ status: 'failed', attempts: 8 });
    expect(rowOf(eighth).lastError).toMatch(/ECONNREFUSED/);
  });
});
