import { desc, eq } from 'drizzle-orm';
import type { Db } from '../connection';
import { auditLog, users } from '../schema';

export interface AuditInput {
  teamId: number | null;
  userId: number | null;
  action: string;
  entityType: string;
  entityId?: number | null;
  detail?: Record<string, unknown>;
}

/** Append one event to the audit log (never updated, never deleted). */
export function writeAudit(db: Db, e: AuditInput) {
  db.insert(auditLog)
    .values({
      teamId: e.teamId,
      userId: e.userId,
      action: e.action,
      entityType: e.entityType,
      entityId: e.entityId ?? null,
      detail: e.detail ?? {},
    })
    .run();
}

export function listAudit(db: Db, teamId: number, limit = 200) {
  return db
    .select({
      id: auditLog.id,
      action: auditLog.action,
      entityType: auditLog.entityType,
      entityId: auditLog.entityId,
      detail: auditLog.detail,
      createdAt: auditLog.createdAt,
      userId: auditLog.userId,
      userName: users.name,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .where(eq(auditLog.teamId, teamId))
    .orderBy(desc(auditLog.id))
    .limit(limit)
    .all();
}
