import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import type SMTPPool from 'nodemailer/lib/smtp-pool';
import { env, localSmtpActualPort } from '@/lib/env';

const globalForMail = globalThis as unknown as { fishplateTransport?: Transporter; fishplateSmtpUrl?: string };

/** Where mail goes: SMTP_URL, or Fishplate's own local catcher on loopback. */
export function smtpUrl(): string {
  // An empty SMTP_URL is unset, as everywhere else (server-start.ts starts the catcher for it).
  return env().SMTP_URL || `smtp://127.0.0.1:${localSmtpActualPort() ?? env().LOCAL_SMTP_PORT}`;
}

/** One pooled SMTP transport per process (rebuilt if the URL changes, as in tests). */
export function getTransport(): Transporter {
  const url = smtpUrl();
  if (!globalForMail.fishplateTransport || globalForMail.fishplateSmtpUrl !== url) {
    globalForMail.fishplateTransport?.close();
    const parsed = new URL(url);
    const options: SMTPPool.Options = {
      pool: true,
      host: parsed.hostname,
      port: Number(parsed.port || (parsed.protocol === 'smtps:' ? 465 : 25)),
      secure: parsed.protocol === 'smtps:',
      ...(parsed.username
        ? { auth: { user: decodeURIComponent(parsed.username), pass: decodeURIComponent(parsed.password) } }
        : {}),
      maxConnections: 4,
      connectionTimeout: 5_000,
      greetingTimeout: 5_000,
      socketTimeout: 10_000,
      ignoreTLS: parsed.hostname === '127.0.0.1' || parsed.hostname === 'localhost',
    };
    // One argument: nodemailer reads a second one as defaults for every message, not as transport options.
    globalForMail.fishplateTransport = nodemailer.createTransport(options);
    globalForMail.fishplateSmtpUrl = url;
  }
  return globalForMail.fishplateTransport;
}

export function closeTransport(): void {
  globalForMail.fishplateTransport?.close();
  globalForMail.fishplateTransport = undefined;
}
