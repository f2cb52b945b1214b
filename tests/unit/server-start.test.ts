// lib/server-start.ts decides, once per process, which services start beside the web server. The
// services themselves have their own tests (tests/integration/mail-*.test.ts, outbox); here they
// are stand-ins that record how they were started, so no port is opened and no worker left running.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

const started = vi.hoisted(() => ({
  getDb: vi.fn(),
  startLocalMailServer: vi.fn(async (port: number) => ({ port: port === 0 ? 40123 : port })),
  startOutboxWorker: vi.fn(),
}));

vi.mock('@/db', async (importOriginal) => ({ ...(await importOriginal<typeof import('@/db')>()), getDb: started.getDb }));
vi.mock('@/lib/mail/local-server', () => ({ startLocalMailServer: started.startLocalMailServer }));
vi.mock('@/lib/mail/outbox', () => ({ startOutboxWorker: started.startOutboxWorker }));

const flag = globalThis as unknown as { fishplateStarted?: boolean };
let log: ReturnType<typeof vi.spyOn>;
let errorLog: ReturnType<typeof vi.spyOn>;

async function start() {
  vi.resetModules();
  const { startServerServices } = await import('@/lib/server-start');
  await startServerServices();
}

beforeEach(() => {
  delete flag.fishplateStarted;
  vi.stubEnv('SMTP_URL', undefined as unknown as string);
  vi.stubEnv('LOCAL_SMTP_PORT', '2525');
  vi.stubEnv('LOCAL_SMTP_ACTUAL_PORT', undefined as unknown as string);
  vi.stubEnv('FISHPLATE_OUTBOX_WORKER', 'on');
  started.getDb.mockClear();
  started.startLocalMailServer.mockClear();
  started.startOutboxWorker.mockClear();
  log = vi.spyOn(console, 'log').mockImplementation(() => undefined);
  errorLog = vi.spyOn(console, 'error').mockImplementation(() => undefined);
});

afterEach(() => {
  delete flag.fishplateStarted;
  vi.unstubAllEnvs();
  vi.restoreAllMocks();
});

describe('startServerServices', () => {
  it('opens the database, starts the mail catcher on LOCAL_SMTP_PORT and the outbox worker, and says where mail goes', async () => {
    await start();
    expect(started.getDb).toHaveBeenCalledTimes(1);
    expect(started.startLocalMailServer).toHaveBeenCalledWith(2525);
    expect(process.env.LOCAL_SMTP_ACTUAL_PORT).toBe('2525');
    expect(log).toHaveBeenCalledWith('Fishplate: local mail catcher on 127.0.0.1:2525 (set SMTP_URL to send real e-mail)');
    expect(started.startOutboxWorker).toHaveBeenCalledTimes(1);
    expect(errorLog).not.toHaveBeenCalled();
  });

  it('publishes the port the catcher really got when asked for any port (0)', async () => {
    vi.stubEnv('LOCAL_SMTP_PORT', '0');
    await start();
    expect(started.startLocalMailServer).toHaveBeenCalledWith(0);
    expect(process.env.LOCAL_SMTP_ACTUAL_PORT).toBe('40123');
  });

  it('runs once per process: a second call starts nothing again', async () => {
    await start();
    await start();
    expect(started.getDb).toHaveBeenCalledTimes(1);
    expect(started.startLocalMailServer).toHaveBeenCalledTimes(1);
    expect(started.startOutboxWorker).toHaveBeenCalledTimes(1);
    expect(flag.fishplateStarted).toBe(true);
  });

  it('starts no catcher when SMTP_URL names a real server', async () => {
    vi.stubEnv('SMTP_URL', 'smtp://mail.fishplate.example:587');
    await start();
    expect(started.startLocalMailServer).not.toHaveBeenCalled();
    expect(process.env.LOCAL_SMTP_ACTUAL_PORT).toBeUndefined();
    expect(log).not.toHaveBeenCalled();
    expect(started.startOutboxWorker).toHaveBeenCalledTimes(1);
  });

  it('keeps starting when the catcher cannot listen, and says why with the port', async () => {
    const busy = Object.assign(new Error('listen EADDRINUSE'), { code: 'EADDRINUSE' });
    started.startLocalMailServer.mockRejectedValueOnce(busy);
    await start();
    expect(errorLog).toHaveBeenCalledWith('Fishplate: could not start the local mail catcher on port 2525:', busy);
    expect(process.env.LOCAL_SMTP_ACTUAL_PORT).toBeUndefined();
    expect(started.startOutboxWorker).toHaveBeenCalledTimes(1);
  });

  it('leaves the outbox worker off when FISHPLATE_OUTBOX_WORKER=off', async () => {
    vi.stubEnv('FISHPLATE_OUTBOX_WORKER', 'off');
    await start();
    expect(started.startOutboxWorker).not.toHaveBeenCalled();
    expect(started.startLocalMailServer).toHaveBeenCalledTimes(1);
  });
});
