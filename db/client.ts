import 'server-only';
import { openDatabase, type Db, type OpenDb } from './connection';

// One connection per server process; kept on globalThis so dev reloads reuse it.
declare global {
  var phasewrightDb: OpenDb | undefined;
}

export function getDb(): Db {
  globalThis.phasewrightDb ??= openDatabase();
  return globalThis.phasewrightDb;
}

export type { Db };
