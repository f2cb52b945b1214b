import net from 'node:net';

/**
 * A bare SMTP client for tests that must say what a mail library would not (no From header, a message
 * over the size limit, a reset mid-transaction). Each `send` writes one line and resolves with the whole
 * reply: every line up to the one whose code is followed by a space (RFC 5321 4.2.1, multiline replies).
 */
export async function rawSmtp(port: number) {
  const socket = net.connect(port, '127.0.0.1');
  let heard = '';
  let waiting: ((reply: string) => void) | null = null;
  let failed: Error | null = null;
  const settle = () => {
    const end = /^\d{3} [^\n]*\n/m.exec(heard);
    if (!end || !waiting) return;
    const reply = heard.slice(0, end.index + end[0].length);
    heard = heard.slice(reply.length);
    const resolve = waiting;
    waiting = null;
    resolve(reply);
  };
  socket.on('data', (chunk) => {
    heard += chunk.toString();
    settle();
  });
  socket.on('error', (error) => {
    failed = error;
  });
  const next = () =>
    new Promise<string>((resolve, reject) => {
      if (failed) return reject(failed);
      waiting = resolve;
      settle();
    });
  const greeting = await next();
  return {
    socket,
    greeting,
    /** Writes `line` (CRLF added) and waits for the reply. */
    send(line: string): Promise<string> {
      socket.write(`${line}\r\n`);
      return next();
    },
    /** Writes raw bytes, then waits for the reply (the end of DATA). */
    write(data: string | Buffer): Promise<string> {
      socket.write(data);
      return next();
    },
    close(): Promise<void> {
      return new Promise((resolve) => {
        socket.once('close', () => resolve());
        socket.end('QUIT\r\n');
      });
    },
  };
}
