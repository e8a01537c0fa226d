import { asc, eq } from 'drizzle-orm';
import type { Db } from '../connection';
import { remarks, users } from '../schema';
import { writeAudit } from './audit';

/** Remarks on a revision, oldest first, with the author's name. */
export function listRemarks(db: Db, revisionId: number) {
  return db
    .select({
      id: remarks.id,
      revisionId: remarks.revisionId,
      authorId: remarks.authorId,
      authorName: users.name,
      body: remarks.body,
      createdAt: remarks.createdAt,
    })
    .from(remarks)
    .innerJoin(users, eq(users.id, remarks.authorId))
    .where(eq(remarks.revisionId, revisionId))
    .orderBy(asc(remarks.id))
    .all();
}

export type RemarkView = ReturnType<typeof listRemarks>[number];

/** Attach a remark to a revision (the revision itself stays untouched). */
export function addRemark(
  db: Db,
  r: { teamId: number; designId: number; revisionId: number; number: number; authorId: number; body: string },
) {
  return db.transaction((tx) => {
    const row = tx.insert(remarks).values({ revisionId: r.revisionId, authorId: r.authorId, body: r.body }).returning().get();
    writeAudit(tx, {
      teamId: r.teamId,
      userId: r.authorId,
      action: 'remark.added',
      entityType: 'revision',
      entityId: r.revisionId,
      detail: { designId: r.designId, number: r.number, remarkId: row.id },
    });
    return row;
  });
}
