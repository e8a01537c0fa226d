import 'server-only';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { resolveDatabasePath } from '@/db/connection';

/** The secret file beside the database (data/auth-secret by default). */
export function authSecretPath(): string {
  const db = resolveDatabasePath();
  const dir = db === ':memory:' ? path.resolve('data') : path.dirname(db);
  return path.join(dir, 'auth-secret');
}

/**
 * NEXTAUTH_SECRET when set; otherwise a random secret kept beside the
 * database (owner-only), so a fresh install signs people in without any
 * setting and sessions survive a restart. An empty or too short file is
 * replaced by a new secret (sessions signed with nothing cannot be valid);
 * a file that cannot be read stops the start with an error naming it.
 */
export function getAuthSecret(): string {
  if (process.env.NEXTAUTH_SECRET) return process.env.NEXTAUTH_SECRET;
  const file = authSecretPath();
  let existing: string | null = null;
  try {
    existing = fs.readFileSync(file, 'utf8').trim();
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code !== 'ENOENT')
      throw new Error(`Cannot read the auth secret file ${file} (${code}); fix its permissions, delete it to have a new one made, or set NEXTAUTH_SECRET`);
  }
  if (existing && existing.length >= 32) return existing;
  if (existing !== null) console.warn(`[auth] ${file} was empty or too short; wrote a new secret (everyone signs in again)`);
  fs.mkdirSync(path.dirname(file), { recursive: true, mode: 0o700 });
  const secret = crypto.randomBytes(32).toString('base64url');
  fs.writeFileSync(file, secret, { mode: 0o600 });
  fs.chmodSync(file, 0o600);
  return secret;
}
