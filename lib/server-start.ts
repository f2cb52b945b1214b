import { getDb } from '@/db';
import { env } from '@/lib/env';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { startOutboxWorker } from '@/lib/mail/outbox';

const globalForStart = globalThis as unknown as { fishplateStarted?: boolean };

/**
 * Runs once per server process: applies migrations, starts the local mail catcher when no
 * SMTP_URL is set, and starts the outbox worker.
 */
export async function startServerServices(): Promise<void> {
  if (globalForStart.fishplateStarted) return;
  globalForStart.fishplateStarted = true;
  getDb();
  const config = env();
  if (!config.SMTP_URL) {
    try {
      const server = await startLocalMailServer(config.LOCAL_SMTP_PORT);
      process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
      console.log(`Fishplate: local mail catcher on 127.0.0.1:${server.port} (set SMTP_URL to send real e-mail)`);
    } catch (error) {
      console.error(`Fishplate: could not start the local mail catcher on port ${config.LOCAL_SMTP_PORT}:`, error);
    }
  }
  if (config.FISHPLATE_OUTBOX_WORKER === 'on') startOutboxWorker();
}
