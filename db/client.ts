import 'server-only';
import { openDatabase, type Db } from './connection';

// One connection per server process; kept on globalThis so dev reloads reuse it.
const globalForDb = globalThis as unknown as { phasewrightDb?: Db };

export function getDb(): Db {
  globalForDb.phasewrightDb ??= openDatabase();
  return globalForDb.phasewrightDb;
}

export type { Db };
