import crypto from 'node:crypto';
import { and, desc, eq } from 'drizzle-orm';
import type { Db } from '../connection';
import { apiTokens } from '../schema';
import { writeAudit } from './audit';

/**
 * Personal API tokens. The token is `pw_` + 32 random bytes (base64url),
 * shown once; only its SHA-256 is stored (a random token needs no slow hash).
 */
export const API_TOKEN_PREFIX = 'pw_';

export function hashApiToken(token: string) {
  return crypto.createHash('sha256').update(token).digest('hex');
}

export function createApiToken(db: Db, userId: number, name: string) {
  const token = API_TOKEN_PREFIX + crypto.randomBytes(32).toString('base64url');
  const row = db
    .insert(apiTokens)
    .values({ userId, name, tokenHash: hashApiToken(token), prefix: token.slice(0, 10) })
    .returning({ id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, createdAt: apiTokens.createdAt })
    .get();
  writeAudit(db, { teamId: null, userId, action: 'api-token.created', entityType: 'api-token', entityId: row.id, detail: { name } });
  return { ...row, token };
}

export function listApiTokens(db: Db, userId: number) {
  return db
    .select({ id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt })
    .from(apiTokens)
    .where(eq(apiTokens.userId, userId))
    .orderBy(desc(apiTokens.id))
    .all();
}

/** Revoke one of the user's own tokens; false when it is not theirs or already gone. */
export function revokeApiToken(db: Db, userId: number, tokenId: number) {
  const r = db.delete(apiTokens).where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId))).run();
  if (r.changes > 0) writeAudit(db, { teamId: null, userId, action: 'api-token.revoked', entityType: 'api-token', entityId: tokenId, detail: {} });
  return r.changes > 0;
}

/** The user a presented token belongs to (one indexed lookup), or null. */
export function userIdForApiToken(db: Db, token: string): number | null {
  if (!token.startsWith(API_TOKEN_PREFIX) || token.length > 200) return null;
  const row = db.select({ id: apiTokens.id, userId: apiTokens.userId, lastUsedAt: apiTokens.lastUsedAt }).from(apiTokens).where(eq(apiTokens.tokenHash, hashApiToken(token))).get();
  if (!row) return null;
  // Record use at most once a minute: a write per request would cost more than the lookup.
  const now = Date.now();
  if (!row.lastUsedAt || now - row.lastUsedAt.getTime() > 60_000) db.update(apiTokens).set({ lastUsedAt: new Date(now) }).where(eq(apiTokens.id, row.id)).run();
  return row.userId;
}
