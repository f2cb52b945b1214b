import 'server-only';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { storeCaughtMail } from '@/db/queries/caught-mail';

const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase())).filter(Boolean);
}

/**
 * Fishplate's own mail catcher: an SMTP server on loopback that keeps every message it receives
 * in the database, so sign-in links and invitations work with no mail server installed.
 */
export function startLocalMailServer(port: number, host = '127.0.0.1'): Promise<SMTPServer & { port: number }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    banner: 'Fishplate local mail catcher',
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        // 552, a permanent refusal (RFC 1870 6.1): with smtp-server's default 450 the sender would try again.
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((parsed) => {
            const envelopeTo = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
            const to = [...new Set([...envelopeTo, ...addressesOf(parsed.to)])];
            storeCaughtMail({
              messageId: parsed.messageId ?? null,
              fromAddress: addressesOf(parsed.from)[0] ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address.toLowerCase() : ''),
              toAddresses: `,${to.join(',')},`,
              subject: parsed.subject ?? '(no subject)',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : null,
              raw: raw.toString('utf8'),
            });
            callback();
          })
          .catch((error: Error) => callback(error));
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      // From now on an error is one client's connection (a sender killed mid-message resets it): log it and
      // serve on. smtp-server emits connection errors on the server, and an 'error' with no listener would
      // throw and take the whole app's process down with it.
      server.off('error', reject);
      server.on('error', (error: NodeJS.ErrnoException) => {
        if (error.code !== 'ECONNRESET' && error.code !== 'EPIPE') console.warn(`local mail catcher: ${error.message}`);
      });
      // Listening on a TCP port, the address is always { address, family, port } (Node.js net server.address()).
      resolve(Object.assign(server, { port: (server.server.address() as AddressInfo).port }));
    });
  });
}
