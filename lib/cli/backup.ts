// npm run db:backup [FILE] — a consistent copy of the live database, taken with SQLite's online
// backup API (better-sqlite3's db.backup), safe while the app is running and writing.
import path from 'node:path';
import { databasePath, openDatabase } from '@/db';

export async function backupDatabase(source: string, target: string): Promise<{ pages: number }> {
  const db = openDatabase(source, { migrate: false });
  try {
    let pages = 0;
    await db.$client.backup(target, {
      progress: ({ totalPages }) => {
        pages = totalPages;
        return 200; // pages per step: lets the app's writers in between steps
      },
    });
    return { pages };
  } finally {
    db.$client.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('backup.ts')) {
  const stamp = new Date().toISOString().replaceAll(':', '-').replace(/\..+$/, '');
  const target = process.argv[2] ?? path.join('data', 'backups', `fishplate-${stamp}.db`);
  await import('node:fs').then((fs) => fs.mkdirSync(path.dirname(path.resolve(target)), { recursive: true }));
  const { pages } = await backupDatabase(databasePath(), target);
  console.log(`Backed up ${databasePath()} to ${target} (${pages} pages).`);
}
