import net from 'node:net';
import path from 'node:path';
import { eq, like } from 'drizzle-orm';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { closeDb, getDb } from '@/db';
import { caughtMail } from '@/db/schema';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { rawSmtp } from './smtp-client';

// The local mail catcher (lib/mail/local-server.ts) spoken to by hand, with messages a mail library would
// not write: no From, no To, no Subject, no Message-ID, only HTML, address groups, too large.

let server: Awaited<ReturnType<typeof startLocalMailServer>>;

// A catcher per test, started in beforeEach rather than beforeAll: the mutation run (Stryker's per-test
// coverage) only credits a test with the code that runs inside it or its beforeEach.
beforeEach(async () => {
  server = await startLocalMailServer(0);
});

afterEach(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

let counter = 0;

/** Sends one message (header and body lines, CRLF-joined) with the envelope given; returns the final reply. */
async function deliver(envelope: { from: string; to: string[] }, lines: string[]) {
  const smtp = await rawSmtp(server.port);
  expect(await smtp.send('EHLO sender.test')).toMatch(/^250 /m);
  expect(await smtp.send(`MAIL FROM:<${envelope.from}>`)).toMatch(/^250 /);
  for (const to of envelope.to) expect(await smtp.send(`RCPT TO:<${to}>`)).toMatch(/^250 /);
  expect(await smtp.send('DATA')).toMatch(/^354 /);
  // The end of the data is a line holding one dot (RFC 5321 4.1.1.4).
  const reply = await smtp.write(`${lines.join('\r\n')}\r\n.\r\n`);
  await smtp.close();
  return reply;
}

/** The one caught message whose raw text holds `marker`. */
function caught(marker: string) {
  const rows = getDb().select().from(caughtMail).where(like(caughtMail.raw, `%${marker}%`)).all();
  expect(rows).toHaveLength(1);
  return rows[0]!;
}

const marker = () => `marker-${(counter += 1)}-${Date.now()}`;

describe('the local mail catcher', () => {
  it('listens on loopback by default and greets as Fishplate’s catcher (RFC 5321 4.2: 220 greeting)', async () => {
    const address = server.server.address() as net.AddressInfo;
    expect(address.address).toBe('127.0.0.1');
    expect(address.port).toBe(server.port);
    expect(server.port).toBeGreaterThan(0);
    const smtp = await rawSmtp(server.port);
    expect(smtp.greeting).toMatch(/^220 .*Fishplate local mail catcher/);
    await smtp.close();
  });

  it('offers neither STARTTLS nor AUTH, and announces its 10 MiB size limit (RFC 3207, RFC 4954, RFC 1870)', async () => {
    const smtp = await rawSmtp(server.port);
    const ehlo = await smtp.send('EHLO sender.test');
    expect(ehlo).toMatch(/^250[- ]SIZE 10485760\r?$/m);
    expect(ehlo).not.toMatch(/STARTTLS/);
    expect(ehlo).not.toMatch(/^250[- ]AUTH/m);
    // Disabled commands are unknown to it; mail goes through with no authentication (authOptional).
    expect(await smtp.send('STARTTLS')).toMatch(/^5\d\d /);
    expect(await smtp.send('AUTH PLAIN AGxvZ2luAHBhc3M=')).toMatch(/^5\d\d /);
    expect(await smtp.send('MAIL FROM:<anyone@sender.test>')).toMatch(/^250 /);
    await smtp.close();
  });

  it('keeps a full message with its headers: Message-ID, From, To and Cc in lower case, subject, text and HTML', async () => {
    const m = marker();
    const reply = await deliver({ from: 'bounce@sender.test', to: ['Crew@Test.example'] }, [
      `Message-ID: <${m}@sender.test>`,
      'From: "Dot Sender" <Dot.Sender@Sender.test>',
      'To: "Crew" <Crew@Test.example>, Other@Test.example',
      'Cc: Copy@Test.example',
      'Subject: Timetable for Friday',
      'MIME-Version: 1.0',
      'Content-Type: multipart/alternative; boundary="b1"',
      '',
      '--b1',
      'Content-Type: text/plain; charset=utf-8',
      '',
      `Plain ${m}`,
      '--b1',
      'Content-Type: text/html; charset=utf-8',
      '',
      `<p>Rich ${m}</p>`,
      '--b1--',
    ]);
    expect(reply).toMatch(/^250 /);
    const row = caught(m);
    expect(row.messageId).toBe(`<${m}@sender.test>`);
    // The From header's address, not the envelope's (RFC 5322 3.6.2 author vs RFC 5321 3.3 reverse-path).
    expect(row.fromAddress).toBe('dot.sender@sender.test');
    // Envelope recipients first, then the To header's, each once: a comma list with commas at both ends
    // so that `LIKE '%,addr,%'` finds one address exactly. Cc is not a To.
    expect(row.toAddresses).toBe(',crew@test.example,other@test.example,');
    expect(row.subject).toBe('Timetable for Friday');
    expect(row.text.trim()).toBe(`Plain ${m}`);
    expect(row.html?.trim()).toBe(`<p>Rich ${m}</p>`);
    expect(row.raw).toContain(`Message-ID: <${m}@sender.test>`);
  });

  // No header at all: the message starts with the empty line that ends the header section (RFC 5322 2.1).
  it('fills in what a bare message lacks: envelope sender, envelope recipients, "(no subject)", no Message-ID, no HTML', async () => {
    const m = marker();
    const reply = await deliver({ from: 'Envelope.Sender@Sender.test', to: ['Bcc.Only@Test.example'] }, ['', `Body ${m}`]);
    expect(reply).toMatch(/^250 /);
    const row = caught(m);
    expect(row.messageId).toBeNull();
    // No From header: the envelope's reverse-path (RFC 5321 4.1.1.2) is who sent it, in lower case as
    // every address the catcher keeps.
    expect(row.fromAddress).toBe('envelope.sender@sender.test');
    expect(row.toAddresses).toBe(',bcc.only@test.example,');
    expect(row.subject).toBe('(no subject)');
    expect(row.text.trim()).toBe(`Body ${m}`);
    expect(row.html).toBeNull();
  });

  it('keeps a message from the null reverse-path (a bounce, RFC 5321 4.5.5) with an empty sender', async () => {
    const m = marker();
    expect(await deliver({ from: '', to: ['crew@test.example'] }, [`Subject: Undeliverable ${m}`, '', 'Bounced.'])).toMatch(/^250 /);
    expect(caught(m).fromAddress).toBe('');
  });

  it('keeps several messages without a Message-ID (only a repeated Message-ID is dropped)', async () => {
    const first = marker();
    const second = marker();
    await deliver({ from: 'a@sender.test', to: ['crew@test.example'] }, [`Subject: ${first}`, '', 'One.']);
    await deliver({ from: 'a@sender.test', to: ['crew@test.example'] }, [`Subject: ${second}`, '', 'Two.']);
    expect(caught(first).subject).toBe(first);
    expect(caught(second).subject).toBe(second);
  });

  it('reads every To header and skips a group with no addresses (RFC 5322 3.4: group syntax)', async () => {
    const m = marker();
    await deliver({ from: 'a@sender.test', to: ['Env@Test.example'] }, [
      'From: undisclosed-senders:;',
      'To: undisclosed-recipients:;',
      'To: Second@Test.example',
      `Subject: ${m}`,
      'Content-Type: text/html; charset=utf-8',
      '',
      `<p>Only <b>HTML</b> ${m}</p>`,
    ]);
    const row = caught(m);
    expect(row.toAddresses).toBe(',env@test.example,second@test.example,');
    // A From that names no address: the envelope sender stands in.
    expect(row.fromAddress).toBe('a@sender.test');
    expect(row.html?.trim()).toBe(`<p>Only <b>HTML</b> ${m}</p>`);
    // mailparser derives the text of an HTML-only message.
    expect(row.text).toContain(`Only HTML ${m}`);
  });

  it('refuses a message over 10 MiB with 552 and keeps nothing of it (RFC 1870 6.1, RFC 5321 4.5.3.1.10)', async () => {
    const m = marker();
    const line = 'x'.repeat(998); // the longest line allowed (RFC 5322 2.1.1)
    const body = Array.from({ length: Math.ceil((10 * 1024 * 1024) / 1000) + 10 }, () => line);
    const reply = await deliver({ from: 'big@sender.test', to: ['crew@test.example'] }, [`Subject: ${m}`, '', ...body]);
    expect(reply).toMatch(/^552 Message too large/);
    expect(getDb().select().from(caughtMail).where(eq(caughtMail.subject, m)).all()).toEqual([]);
  });
});

describe('the local mail catcher, odd cases', () => {
  it('keeps a message with no text part at all with empty text (an attachment only)', async () => {
    const m = marker();
    await deliver({ from: 'a@sender.test', to: ['crew@test.example'] }, [
      `Subject: ${m}`,
      'MIME-Version: 1.0',
      'Content-Type: application/octet-stream',
      'Content-Transfer-Encoding: base64',
      '',
      Buffer.from(`binary ${m}`).toString('base64'),
    ]);
    const row = caught(m);
    expect(row.text).toBe('');
    expect(row.html).toBeNull();
  });

  it('answers a message it cannot keep with a transient 4xx, not silence (RFC 5321 4.2.1, 4.5.4.1: the sender tries again)', async () => {
    const databaseUrl = process.env.DATABASE_URL!;
    try {
      // A directory is no SQLite file: storing the message fails.
      closeDb();
      process.env.DATABASE_URL = path.dirname(databaseUrl);
      const reply = await deliver({ from: 'a@sender.test', to: ['crew@test.example'] }, ['Subject: unkept', '', 'Body.']);
      expect(reply).toMatch(/^4\d\d /);
    } finally {
      process.env.DATABASE_URL = databaseUrl;
    }
  });

  it('writes nothing to the log for a message it keeps: sign-in links and reply tokens stay out of logs (OWASP Logging Cheat Sheet)', async () => {
    const spies = (['log', 'info', 'warn', 'error', 'debug'] as const).map((level) => vi.spyOn(console, level).mockImplementation(() => undefined));
    try {
      const m = marker();
      expect(await deliver({ from: 'a@sender.test', to: ['crew@test.example'] }, [`Subject: ${m}`, '', 'https://fishplate.test/sign-in/link?token=secret'])).toMatch(/^250 /);
      for (const spy of spies) expect(spy).not.toHaveBeenCalled();
    } finally {
      for (const spy of spies) spy.mockRestore();
    }
  });
});

describe('starting the catcher', () => {
  it('fails to start on a port already taken, with the listen error', async () => {
    await expect(startLocalMailServer(server.port)).rejects.toMatchObject({ code: 'EADDRINUSE' });
  });

  it('logs a connection error that is not a reset, and keeps quiet about resets (ECONNRESET, EPIPE)', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    try {
      for (const code of ['ECONNRESET', 'EPIPE']) server.emit('error', Object.assign(new Error(`quiet ${code}`), { code }));
      expect(warn).not.toHaveBeenCalled();
      server.emit('error', Object.assign(new Error('socket hang-up of another kind'), { code: 'ETIMEDOUT' }));
      expect(warn).toHaveBeenCalledWith('local mail catcher: socket hang-up of another kind');
      // And it still serves.
      const smtp = await rawSmtp(server.port);
      expect(smtp.greeting).toMatch(/^220 /);
      await smtp.close();
    } finally {
      warn.mockRestore();
    }
  });
});
