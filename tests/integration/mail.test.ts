import net from 'node:net';
import { eq } from 'drizzle-orm';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import { caughtMail, outbox } from '@/db/schema';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { deliverDueMail, enqueueMail, retryDelayMs } from '@/lib/mail/outbox';
import { closeTransport } from '@/lib/mail/transport';

let server: Awaited<ReturnType<typeof startLocalMailServer>>;

beforeAll(async () => {
  server = await startLocalMailServer(0);
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
});

afterAll(async () => {
  closeTransport();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

function message(key: string, to = 'crew@test.example') {
  return { railwayId: null, dedupeKey: key, kind: 'test', toAddress: to, subject: `Subject ${key} – ünïcode ✓`, text: `Body of ${key}` };
}

describe('mail through the outbox and the local mail server', () => {
  it('a queued message arrives over real SMTP, is kept, and parses back with its headers', async () => {
    expect(enqueueMail(message('first'))).toBe(true);
    const result = await deliverDueMail();
    expect(result).toEqual({ sent: 1, failed: 0 });
    const caught = getDb().select().from(caughtMail).all();
    expect(caught).toHaveLength(1);
    const parsed = await simpleParser(caught[0]!.raw);
    expect(parsed.subject).toBe('Subject first – ünïcode ✓'); // RFC 2047 encoded-word round trip
    expect(parsed.text?.trim()).toBe('Body of first');
    const row = getDb().select().from(outbox).where(eq(outbox.dedupeKey, 'first')).get();
    expect(row).toMatchObject({ status: 'sent', attempts: 1 });
    expect(parsed.messageId).toBe(`<${row!.id}@fishplate.local>`);
  });

  it('the same dedupe key is queued once, so no one gets the same message twice', async () => {
    expect(enqueueMail(message('twice'))).toBe(true);
    expect(enqueueMail(message('twice'))).toBe(false);
    await deliverDueMail();
    expect(getDb().select().from(caughtMail).all().filter((m) => m.subject.startsWith('Subject twice'))).toHaveLength(1);
  });

  it('when the mail server is down the message waits with the error and a backoff, then goes once', async () => {
    // A port with nothing listening: take a free one and close it again.
    const closedPort = await new Promise<number>((resolve) => {
      const probe = net.createServer().listen(0, '127.0.0.1', () => {
        const port = (probe.address() as net.AddressInfo).port;
        probe.close(() => resolve(port));
      });
    });
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(closedPort);
    enqueueMail(message('retry'));
    const down = await deliverDueMail();
    expect(down).toEqual({ sent: 0, failed: 1 });
    const waiting = getDb().select().from(outbox).where(eq(outbox.dedupeKey, 'retry')).get()!;
    expect(waiting.status).toBe('queued');
    expect(waiting.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(waiting.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() + 3_000);
    // Not due yet: nothing is sent early.
    process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
    expect(await deliverDueMail()).toEqual({ sent: 0, failed: 0 });
    getDb().update(outbox).set({ nextAttemptAt: new Date(0) }).where(eq(outbox.dedupeKey, 'retry')).run();
    expect(await deliverDueMail()).toEqual({ sent: 1, failed: 0 });
    expect(getDb().select().from(caughtMail).all().filter((m) => m.subject.startsWith('Subject retry'))).toHaveLength(1);
  });

  it('a message delivered twice with the same Message-ID (a crash between send and mark) is kept once', async () => {
    enqueueMail(message('crash'));
    await deliverDueMail();
    getDb().update(outbox).set({ status: 'queued', nextAttemptAt: new Date(0) }).where(eq(outbox.dedupeKey, 'crash')).run();
    await deliverDueMail();
    expect(getDb().select().from(caughtMail).all().filter((m) => m.subject.startsWith('Subject crash'))).toHaveLength(1);
  });

  it('a sender that dies mid-conversation (its connection reset) does not stop the mail catcher', async () => {
    // A killed sender's socket is reset (TCP RST, RFC 9293 3.5.2); inside a mail transaction smtp-server reports it
    // as an 'error' on the server, which must not become an uncaught exception in the app's process. Three resets,
    // then mail still flows (without the server's error listener Vitest reports two uncaught ECONNRESETs and the run fails).
    for (let i = 0; i < 3; i += 1) {
      const socket = net.connect(server.port, '127.0.0.1');
      let heard = '';
      // Greeting, EHLO, then MAIL FROM (RFC 5321 3.3): the reset comes inside a mail transaction, where
      // smtp-server reports it (outside one it ends the connection quietly).
      const steps = ['EHLO sender.test', 'MAIL FROM:<sender@sender.test>'];
      await new Promise<void>((resolve, reject) => {
        socket.on('error', reject);
        socket.on('data', (chunk) => {
          heard += chunk.toString();
          if (!/^(220|250) [^\n]*\n/m.test(heard.split(/\r?\n(?=\d{3} )/).at(-1) ?? '')) return; // wait for a whole final reply line
          heard = '';
          const next = steps.shift();
          if (next) socket.write(`${next}\r\n`);
          else resolve();
        });
      });
      const closed = new Promise((resolve) => socket.once('close', resolve));
      socket.resetAndDestroy();
      await closed;
    }
    expect(enqueueMail(message('after-resets'))).toBe(true);
    expect(await deliverDueMail()).toEqual({ sent: 1, failed: 0 });
    expect(getDb().select().from(caughtMail).all().some((m) => m.subject.startsWith('Subject after-resets'))).toBe(true);
  });

  it('backs off exponentially and caps the wait', () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([5_000, 10_000, 20_000, 40_000]);
    expect(retryDelayMs(30)).toBe(600_000);
  });
});
