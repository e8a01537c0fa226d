import 'server-only';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { resolveDatabasePath } from '@/db/connection';

/**
 * NEXTAUTH_SECRET when set; otherwise a random secret kept beside the
 * database, so a fresh install signs people in without any setting and
 * sessions survive a restart.
 */
export function getAuthSecret(): string {
  if (process.env.NEXTAUTH_SECRET) return process.env.NEXTAUTH_SECRET;
  const db = resolveDatabasePath();
  const dir = db === ':memory:' ? path.resolve('data') : path.dirname(db);
  const file = path.join(dir, 'auth-secret');
  try {
    return fs.readFileSync(file, 'utf8').trim();
  } catch {
    fs.mkdirSync(dir, { recursive: true });
    const secret = crypto.randomBytes(32).toString('base64url');
    fs.writeFileSync(file, secret, { mode: 0o600, flag: 'wx' });
    return secret;
  }
}
