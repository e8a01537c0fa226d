import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { openDatabase, type OpenDb } from '@/db/connection';

/** A migrated database in a temporary file, removed by the returned cleanup. */
export function tempDb(): { db: OpenDb; file: string; cleanup: () => void } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'phasewright-db-'));
  const file = path.join(dir, 'test.db');
  const db = openDatabase(file);
  return {
    db,
    file,
    cleanup: () => {
      db.$client.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
