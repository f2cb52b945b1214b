import { afterEach, describe, expect, it, vi } from 'vitest';
import { databasePath } from '@/db';
import { env, localSmtpActualPort, resetEnvCache } from '@/lib/env';

afterEach(() => {
  vi.unstubAllEnvs();
  resetEnvCache();
});

describe('environment (lib/env.ts validates every variable the app reads)', () => {
  it('names the variable and the allowed values when a FISHPLATE_ switch is misspelt', () => {
    vi.stubEnv('FISHPLATE_OUTBOX_WORKER', 'of');
    resetEnvCache();
    expect(() => env()).toThrow(/FISHPLATE_OUTBOX_WORKER/);
  });

  it('refuses a demo switch other than 0 or 1', () => {
    vi.stubEnv('FISHPLATE_DEMO', 'yes');
    resetEnvCache();
    expect(() => env()).toThrow(/FISHPLATE_DEMO/);
  });

  it('defaults the switches: outbox worker on, demo sign-ins hidden', () => {
    vi.stubEnv('FISHPLATE_OUTBOX_WORKER', undefined as unknown as string);
    vi.stubEnv('FISHPLATE_DEMO', undefined as unknown as string);
    resetEnvCache();
    expect(env().FISHPLATE_OUTBOX_WORKER).toBe('on');
    expect(env().FISHPLATE_DEMO).toBe('0');
  });

  it('reads the database path from one schema, file: prefix stripped, blank refused', () => {
    expect(databasePath('file:data/x.db')).toBe('data/x.db');
    expect(databasePath(undefined)).toBe('data/fishplate.db');
    expect(() => databasePath('   ')).toThrow();
    vi.stubEnv('DATABASE_URL', '');
    resetEnvCache();
    expect(() => env()).toThrow(/DATABASE_URL/);
  });

  it('reads the mail catcher port fresh on every call and refuses a port out of range', () => {
    vi.stubEnv('LOCAL_SMTP_ACTUAL_PORT', '2601');
    expect(localSmtpActualPort()).toBe(2601);
    vi.stubEnv('LOCAL_SMTP_ACTUAL_PORT', '2602');
    expect(localSmtpActualPort()).toBe(2602);
    vi.stubEnv('LOCAL_SMTP_ACTUAL_PORT', '70000');
    expect(() => localSmtpActualPort()).toThrow();
  });
});
