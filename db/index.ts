import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { z } from 'zod';
import * as schema from './schema';

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

/** DATABASE_URL: the SQLite file, a path optionally prefixed with file:. lib/env.ts validates it with the rest. */
export const databaseUrlSchema = z.string().trim().min(1).default('data/fishplate.db');

/** Where the SQLite file lives, from DATABASE_URL. */
export function databasePath(url: string | undefined = process.env.DATABASE_URL): string {
  const value = databaseUrlSchema.parse(url);
  return value.startsWith('file:') ? value.slice('file:'.length) : value;
}

/**
 * Opens the database file with the settings every connection needs: WAL so readers never wait for
 * the writer, foreign keys enforced, and a busy timeout so concurrent writers queue instead of failing.
 */
export function openDatabase(file = databasePath(), options: { migrate?: boolean } = {}): Db {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const sqlite = new Database(file);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  const db = drizzle(sqlite, { schema }) as Db;
  if (options.migrate !== false) {
    migrate(db, { migrationsFolder: path.join(process.cwd(), 'drizzle') });
  }
  return db;
}

const globalForDb = globalThis as unknown as { fishplateDb?: Db };

/** The one database handle of this process, opened (and migrated) on first use. */
export function getDb(): Db {
  globalForDb.fishplateDb ??= openDatabase();
  return globalForDb.fishplateDb;
}

/**
 * Statements built once per database handle and reused on every call: `build` makes Drizzle queries
 * with `sql.placeholder(…)` for their values and ends each with `.prepare()`, so a hot path neither
 * builds the query nor has SQLite compile it again. Kept per handle, so a reopened database (tests,
 * scripts that switch DATABASE_URL) gets its own.
 */
export function preparedStatements<T extends object>(build: (db: Db) => T): () => T {
  const built = new WeakMap<Db, T>();
  return () => {
    const db = getDb();
    let statements = built.get(db);
    if (!statements) built.set(db, (statements = build(db)));
    return statements;
  };
}

type Transaction = Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * Runs `fn` as one write transaction that takes the write lock at BEGIN (IMMEDIATE). A deferred
 * transaction that reads and then writes can fail at once with SQLITE_BUSY when another writer got
 * in between, whatever the busy timeout; an immediate one waits its turn instead.
 */
export function writeTransaction<T>(fn: (tx: Transaction) => T): T {
  return getDb().transaction(fn, { behavior: 'immediate' });
}

/** Closes the cached handle (tests and scripts that switch DATABASE_URL). */
export function closeDb(): void {
  globalForDb.fishplateDb?.$client.close();
  globalForDb.fishplateDb = undefined;
}

export { schema };
