import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, beforeEach, vi } from 'vitest';
import { closeDb } from '@/db';
import { resetEnvCache } from '@/lib/env';
import { resetRateLimits } from '@/lib/rate-limit';
import { caller } from './caller';

// Who is asking: integration tests set `caller.user` instead of carrying a signed cookie. Every
// role check below this (requireMember and the queries) is the real code.
vi.mock('@/lib/current-user', () => ({
  currentUser: async () => caller.user,
}));
vi.mock('next/cache', () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

let dir: string;

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-it-'));
  closeDb();
  process.env.DATABASE_URL = path.join(dir, 'test.db');
  process.env.NEXTAUTH_URL = 'http://127.0.0.1:3999';
  delete process.env.SMTP_URL;
  resetEnvCache();
});

beforeEach(() => resetRateLimits());

afterAll(() => {
  closeDb();
  fs.rmSync(dir, { recursive: true, force: true });
});
