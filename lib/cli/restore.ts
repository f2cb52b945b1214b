// npm run db:restore FILE — replaces the database with a backup. Stop the app first: the copy is
// checked (integrity_check) before anything is replaced, and the old file is kept beside it.
import fs from 'node:fs';
import Database from 'better-sqlite3';
import { databasePath } from '@/db';

export function restoreDatabase(backup: string, target: string): { keptAs: string | null } {
  if (!fs.existsSync(backup)) throw new Error(`No backup at ${backup}.`);
  const check = new Database(backup, { readonly: true, fileMustExist: true });
  try {
    const result = check.pragma('integrity_check', { simple: true });
    if (result !== 'ok') throw new Error(`The backup ${backup} fails integrity_check: ${String(result)}`);
  } finally {
    check.close();
  }
  let keptAs: string | null = null;
  if (fs.existsSync(target)) {
    keptAs = `${target}.before-restore-${Date.now()}`;
    fs.renameSync(target, keptAs);
  }
  for (const suffix of ['-wal', '-shm']) fs.rmSync(target + suffix, { force: true });
  fs.copyFileSync(backup, target);
  return { keptAs };
}

if (process.argv[1]?.endsWith('restore.ts')) {
  const backup = process.argv[2];
  if (!backup) {
    console.error('Usage: npm run db:restore FILE');
    process.exit(2);
  }
  const { keptAs } = restoreDatabase(backup, databasePath());
  console.log(`Restored ${databasePath()} from ${backup}.${keptAs ? ` The previous file is kept as ${keptAs}.` : ''}`);
}
