// lib/env.ts, every variable's default, bounds and refusal message. The module is loaded again in each
// case (vi.resetModules, then import): its schema is built when the module is evaluated, and a module
// imported at the top of this file would be built before a mutation test run switches a change on.
import { afterEach, describe, expect, it, vi } from 'vitest';

type EnvModule = typeof import('@/lib/env');

const VARS = [
  'NODE_ENV',
  'NEXTAUTH_URL',
  'NEXTAUTH_SECRET',
  'SMTP_URL',
  'LOCAL_SMTP_PORT',
  'MAIL_FROM',
  'UPLOADS_DIR',
  'LOCAL_SMTP_ACTUAL_PORT',
  'FISHPLATE_DEMO',
  'TRUSTED_PROXIES',
  'FISHPLATE_OUTBOX_WORKER',
] as const;
type Var = (typeof VARS)[number];

/** The env module loaded fresh with only the given variables set (the rest unset). */
async function load(vars: Partial<Record<Var, string>> = {}): Promise<EnvModule> {
  for (const name of VARS) vi.stubEnv(name, vars[name] as string);
  vi.resetModules();
  return import('@/lib/env');
}

async function read(vars: Partial<Record<Var, string>> = {}) {
  return (await load(vars)).env();
}

async function refusal(vars: Partial<Record<Var, string>>): Promise<string> {
  const m = await load(vars);
  try {
    m.env();
  } catch (error) {
    return (error as Error).message;
  }
  throw new Error(`accepted ${JSON.stringify(vars)}`);
}

afterEach(() => {
  vi.unstubAllEnvs();
});

describe('env(): defaults of every optional variable', () => {
  it('fills in development, the local URL, the sender, the uploads folder and the switches', async () => {
    const e = await read();
    expect(e.NODE_ENV).toBe('development');
    expect(e.NEXTAUTH_URL).toBe('http://localhost:3000');
    expect(e.NEXTAUTH_SECRET).toBeUndefined();
    expect(e.SMTP_URL).toBeUndefined();
    expect(e.LOCAL_SMTP_PORT).toBe(2525);
    expect(e.MAIL_FROM).toBe('Fishplate <no-reply@fishplate.example>');
    expect(e.UPLOADS_DIR).toBe('data/uploads');
    expect(e.LOCAL_SMTP_ACTUAL_PORT).toBeUndefined();
    expect(e.FISHPLATE_DEMO).toBe('0');
    expect(e.TRUSTED_PROXIES).toEqual([]);
    expect(e.FISHPLATE_OUTBOX_WORKER).toBe('on');
  });

  it('takes each allowed value of the switches as given', async () => {
    expect((await read({ NODE_ENV: 'development' })).NODE_ENV).toBe('development');
    expect((await read({ NODE_ENV: 'test' })).NODE_ENV).toBe('test');
    expect((await read({ NODE_ENV: 'production', NEXTAUTH_SECRET: 'a'.repeat(16) })).NODE_ENV).toBe('production');
    expect((await read({ FISHPLATE_DEMO: '0' })).FISHPLATE_DEMO).toBe('0');
    expect((await read({ FISHPLATE_DEMO: '1' })).FISHPLATE_DEMO).toBe('1');
    expect((await read({ FISHPLATE_OUTBOX_WORKER: 'on' })).FISHPLATE_OUTBOX_WORKER).toBe('on');
    expect((await read({ FISHPLATE_OUTBOX_WORKER: 'off' })).FISHPLATE_OUTBOX_WORKER).toBe('off');
    expect(await refusal({ NODE_ENV: 'staging' })).toMatch(/NODE_ENV/);
    expect(await refusal({ FISHPLATE_DEMO: '' })).toMatch(/FISHPLATE_DEMO/);
    expect(await refusal({ FISHPLATE_OUTBOX_WORKER: '' })).toMatch(/FISHPLATE_OUTBOX_WORKER/);
  });
});

describe('env(): bounds', () => {
  it('LOCAL_SMTP_PORT is a TCP port 0–65535, 0 meaning "any free port" (RFC 9293 §3.1, the 16-bit port field)', async () => {
    expect((await read({ LOCAL_SMTP_PORT: '0' })).LOCAL_SMTP_PORT).toBe(0);
    expect((await read({ LOCAL_SMTP_PORT: '65535' })).LOCAL_SMTP_PORT).toBe(65535);
    expect(await refusal({ LOCAL_SMTP_PORT: '65536' })).toMatch(/LOCAL_SMTP_PORT/);
    expect(await refusal({ LOCAL_SMTP_PORT: '-1' })).toMatch(/LOCAL_SMTP_PORT/);
    expect(await refusal({ LOCAL_SMTP_PORT: '25.5' })).toMatch(/LOCAL_SMTP_PORT/);
  });

  it('LOCAL_SMTP_ACTUAL_PORT is a port really listened on, 1–65535 (RFC 9293 §3.1)', async () => {
    expect((await read({ LOCAL_SMTP_ACTUAL_PORT: '1' })).LOCAL_SMTP_ACTUAL_PORT).toBe(1);
    expect((await read({ LOCAL_SMTP_ACTUAL_PORT: '65535' })).LOCAL_SMTP_ACTUAL_PORT).toBe(65535);
    expect(await refusal({ LOCAL_SMTP_ACTUAL_PORT: '0' })).toMatch(/LOCAL_SMTP_ACTUAL_PORT/);
    expect(await refusal({ LOCAL_SMTP_ACTUAL_PORT: '65536' })).toMatch(/LOCAL_SMTP_ACTUAL_PORT/);
  });

  it('NEXTAUTH_SECRET has at least 16 characters, and says so', async () => {
    expect((await read({ NEXTAUTH_SECRET: 's'.repeat(16) })).NEXTAUTH_SECRET).toBe('s'.repeat(16));
    expect(await refusal({ NEXTAUTH_SECRET: 's'.repeat(15) })).toContain('NEXTAUTH_SECRET must be at least 16 characters');
  });

  it('production refuses to start without NEXTAUTH_SECRET; development and test do not need one', async () => {
    expect(await refusal({ NODE_ENV: 'production' })).toBe('NEXTAUTH_SECRET must be set in production');
    expect((await read({ NODE_ENV: 'test' })).NEXTAUTH_SECRET).toBeUndefined();
    expect((await read({ NODE_ENV: 'development' })).NEXTAUTH_SECRET).toBeUndefined();
  });

  it('TRUSTED_PROXIES lists IPv4 and IPv6 addresses (RFC 791, RFC 4291 §2.2), spaces and empty items dropped, at most 20', async () => {
    expect((await read({ TRUSTED_PROXIES: ' 10.0.0.1, ::1,,2001:db8::7 ' })).TRUSTED_PROXIES).toEqual(['10.0.0.1', '::1', '2001:db8::7']);
    const twenty = Array.from({ length: 20 }, (_, i) => `192.0.2.${i + 1}`);
    expect((await read({ TRUSTED_PROXIES: twenty.join(',') })).TRUSTED_PROXIES).toEqual(twenty);
    expect(await refusal({ TRUSTED_PROXIES: [...twenty, '192.0.2.99'].join(',') })).toMatch(/TRUSTED_PROXIES/);
    const named = await refusal({ TRUSTED_PROXIES: '10.0.0.1,proxy.fishplate.example' });
    expect(named).toContain('TRUSTED_PROXIES lists IP addresses, comma-separated');
    expect(named).toMatch(/^Invalid environment:\n/);
  });
});

describe('env(): read once', () => {
  it('keeps the first reading until resetEnvCache()', async () => {
    const m = await load({ MAIL_FROM: 'Crew <crew@fishplate.example>' });
    expect(m.env().MAIL_FROM).toBe('Crew <crew@fishplate.example>');
    vi.stubEnv('MAIL_FROM', 'Other <other@fishplate.example>');
    expect(m.env().MAIL_FROM).toBe('Crew <crew@fishplate.example>');
    m.resetEnvCache();
    expect(m.env().MAIL_FROM).toBe('Other <other@fishplate.example>');
  });

  it('localSmtpActualPort() reads the variable fresh and treats an empty one as unset', async () => {
    const m = await load({ LOCAL_SMTP_ACTUAL_PORT: '' });
    expect(m.localSmtpActualPort()).toBeUndefined();
    vi.stubEnv('LOCAL_SMTP_ACTUAL_PORT', '1');
    expect(m.localSmtpActualPort()).toBe(1);
    vi.stubEnv('LOCAL_SMTP_ACTUAL_PORT', '0');
    expect(() => m.localSmtpActualPort()).toThrow();
  });
});
