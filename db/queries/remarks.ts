import { and, asc, count, desc, eq } from 'drizzle-orm';
import { pageWindow } from '../../lib/paging';
import type { Db } from '../connection';
import { remarks, revisions, signoffEvents, users } from '../schema';
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
      comparedWith: remarks.comparedWith,
      createdAt: remarks.createdAt,
    })
    .from(remarks)
    .innerJoin(users, eq(users.id, remarks.authorId))
    .where(eq(remarks.revisionId, revisionId))
    .orderBy(asc(remarks.id))
    .all();
}

export type RemarkView = ReturnType<typeof listRemarks>[number];

/** One page of a revision's remarks (the History timeline), newest first, 100 a page. */
export function listRemarksPage(db: Db, revisionId: number, page: number) {
  const total = db.select({ n: count() }).from(remarks).where(eq(remarks.revisionId, revisionId)).get()?.n ?? 0;
  const w = pageWindow(total, page);
  const rows = db
    .select({ id: remarks.id, authorName: users.name, body: remarks.body, comparedWith: remarks.comparedWith, createdAt: remarks.createdAt })
    .from(remarks)
    .innerJoin(users, eq(users.id, remarks.authorId))
    .where(eq(remarks.revisionId, revisionId))
    .orderBy(desc(remarks.id))
    .limit(w.pageSize)
    .offset(w.offset)
    .all();
  return { remarks: rows, total, page: w.page, lastPage: w.lastPage };
}

export type RemarkPage = ReturnType<typeof listRemarksPage>;

/** Attach a remark to a revision (the revision itself stays untouched). */
export function addRemark(
  db: Db,
  r: { teamId: number; designId: number; revisionId: number; number: number; authorId: number; body: string; comparedWith?: number | null },
) {
  return db.transaction((tx) => {
    const row = tx.insert(remarks).values({ revisionId: r.revisionId, authorId: r.authorId, body: r.body, comparedWith: r.comparedWith ?? null }).returning().get();
    writeAudit(tx, {
      teamId: r.teamId,
      userId: r.authorId,
      action: 'remark.added',
      entityType: 'revision',
      entityId: r.revisionId,
      detail: { designId: r.designId, number: r.number, remarkId: row.id, comparedWith: r.comparedWith ?? null },
    });
    return row;
  });
}

/**
 * Who hears of a remark on a revision: its author and the reviewer last asked to review it,
 * never the one who wrote the remark. User ids, without repeats.
 */
export function remarkRecipients(db: Db, revisionId: number, writerId: number): number[] {
  const author = db.select({ id: revisions.authorId }).from(revisions).where(eq(revisions.id, revisionId)).get()?.id;
  const reviewer = db
    .select({ id: signoffEvents.reviewerId })
    .from(signoffEvents)
    .where(and(eq(signoffEvents.revisionId, revisionId), eq(signoffEvents.state, 'in-review')))
    .orderBy(desc(signoffEvents.id))
    .limit(1)
    .get()?.id;
  return [...new Set([author, reviewer].filter((id): id is number => id != null && id !== writerId))];
}
