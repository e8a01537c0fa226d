import { createUserWithHash, hashPassword } from '@/db/queries';
import type { Db } from '@/db/connection';

const hashes = new Map<string, string>();

/**
 * createUser for fixtures: the same account (the password signs in), with each password's
 * bcrypt hash computed once per test file instead of once per user (bcryptjs takes tens of
 * milliseconds a hash). Tests of hashing itself call createUser.
 */
export function createTestUser(db: Db, u: { email: string; name: string; password: string }) {
  let passwordHash = hashes.get(u.password);
  if (passwordHash === undefined) hashes.set(u.password, (passwordHash = hashPassword(u.password)));
  return createUserWithHash(db, { email: u.email, name: u.name, passwordHash });
}
