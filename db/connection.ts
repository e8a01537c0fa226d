/**
 * Opening a Phasewright database: better-sqlite3 + Drizzle, WAL and foreign
 * keys on, committed migrations applied. Used by the app, the CLI scripts and
 * the tests (on temporary files or ':memory:').
 */
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import type { BaseSQLiteDatabase } from 'drizzle-orm/sqlite-core';
import type { RunResult } from 'better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import * as schema from './schema';

/**
 * What every query function takes: the app's connection or a transaction on it
 * (a Drizzle transaction is this type too, so `db.transaction((tx) => f(tx))`
 * needs no cast).
 */
export type Db = BaseSQLiteDatabase<'sync', RunResult, typeof schema>;

/** An opened database: a `Db` that also owns the better-sqlite3 handle (to close it). */
export type OpenDb = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

export const DEFAULT_DATABASE_PATH = 'data/phasewright.db';

/** DATABASE_URL may be a plain path or a `file:` URL; default data/phasewright.db. */
export function resolveDatabasePath(url = process.env.DATABASE_URL): string {
  if (!url) return path.resolve(DEFAULT_DATABASE_PATH);
  if (url === ':memory:' || url === 'file::memory:') return ':memory:';
  if (url.startsWith('file://')) return new URL(url).pathname;
  if (url.startsWith('file:')) return path.resolve(url.slice('file:'.length));
  return path.resolve(url);
}

export function migrationsFolder(): string {
  return path.resolve(process.env.PHASEWRIGHT_ROOT ?? process.cwd(), 'db/migrations');
}

export function openDatabase(url?: string): OpenDb {
  const file = resolveDatabasePath(url);
  if (file !== ':memory:') fs.mkdirSync(path.dirname(file), { recursive: true });
  const sqlite = new Database(file);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  // Two servers (or a save racing a seed) may write at once: wait, don't fail.
  sqlite.pragma('busy_timeout = 5000');
  const db = drizzle(sqlite, { schema });
  migrate(db, { migrationsFolder: migrationsFolder() });
  return db;
}
