// In-process benchmarks (builder, control): a fresh SQLite file in a temporary folder with the demo
// railway, opened once and installed as the app's own cached handle so that the queries under test use it.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { openDatabase } from '@/db';
import { seedDemoRailway } from '@/lib/demo/demo-railway';

export function openDemoBenchDatabase(prefix: string) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  const file = path.join(dir, 'bench.db');
  process.env.DATABASE_URL = file;
  const db = openDatabase(file);
  (globalThis as unknown as { fishplateDb?: typeof db }).fishplateDb = db;
  const demo = seedDemoRailway(db, { passwordHash: 'not-used' });
  return { db, dir, demo };
}
