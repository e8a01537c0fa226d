import { and, asc, desc, eq, gt, lte, sql } from 'drizzle-orm';
import { PAGE_SIZE, pageWindow } from '../../lib/paging';
import type { Db } from '../connection';
import type { AnalyzeRequest, Margins } from '../../lib/engine/types';
import type { RevisionSummary } from '../../lib/revision-summary';
import { revisions, users } from '../schema';
import { writeAudit } from './audit';
import { touchDesign } from './designs';

/** Another revision was saved since the one the edit started from. */
export class RevisionConflictError extends Error {
  constructor(
    readonly baseRevision: number | null,
    readonly latestRevision: number | null,
  ) {
    super(`Revision r${latestRevision} was saved after r${baseRevision ?? '–'}, the one this edit started from`);
    this.name = 'RevisionConflictError';
  }
}

export function latestRevisionNumber(db: Db, designId: number): number | null {
  const row = db
    .select({ n: sql<number | null>`max(${revisions.number})` })
    .from(revisions)
    .where(eq(revisions.designId, designId))
    .get();
  return row?.n ?? null;
}

/**
 * Save a new immutable revision. `baseNumber` names the revision the edit
 * started from; when another was saved meanwhile this throws
 * RevisionConflictError and nothing is written. The check and the insert run
 * in one IMMEDIATE transaction, so two saves from one base never both land
 * on the same number (and the unique index backs that up across processes).
 */
export function createRevision(
  db: Db,
  r: {
    teamId: number;
    designId: number;
    baseNumber: number | null;
    input: AnalyzeRequest;
    summary: RevisionSummary;
    authorId: number;
    note: string;
  },
) {
  return db.transaction(
    (tx) => {
      const latest = latestRevisionNumber(tx, r.designId);
      if (latest !== r.baseNumber) throw new RevisionConflictError(r.baseNumber, latest);
      const row = tx
        .insert(revisions)
        .values({
          designId: r.designId,
          number: (latest ?? 0) + 1,
          baseNumber: r.baseNumber,
          input: r.input,
          summary: r.summary,
          authorId: r.authorId,
          note: r.note,
        })
        .returning()
        .get();
      touchDesign(tx, r.designId);
      writeAudit(tx, {
        teamId: r.teamId,
        userId: r.authorId,
        action: 'revision.saved',
        entityType: 'revision',
        entityId: row.id,
        detail: { designId: r.designId, number: row.number, baseNumber: r.baseNumber },
      });
      return row;
    },
    { behavior: 'immediate' },
  );
}

const revisionColumns = {
  id: revisions.id,
  designId: revisions.designId,
  number: revisions.number,
  baseNumber: revisions.baseNumber,
  input: revisions.input,
  summary: revisions.summary,
  authorId: revisions.authorId,
  authorName: users.name,
  note: revisions.note,
  createdAt: revisions.createdAt,
};

export function listRevisions(db: Db, designId: number) {
  return db
    .select(revisionColumns)
    .from(revisions)
    .innerJoin(users, eq(users.id, revisions.authorId))
    .where(eq(revisions.designId, designId))
    .orderBy(asc(revisions.number))
    .all();
}

export function getRevision(db: Db, designId: number, number: number) {
  return db
    .select(revisionColumns)
    .from(revisions)
    .innerJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.designId, designId), eq(revisions.number, number)))
    .get();
}

/**
 * One page of a design's revisions, newest first, with their margins but not their input or full
 * summary (the history table, Tune's and Compare's pickers and GET /api/designs/:id/revisions show
 * number, author, note, margins): 100 a page. Numbers run 1…latest without gaps (revisions are never deleted), so the
 * total is the latest number and page p is the number range (latest − 100p, latest − 100(p − 1)]:
 * both are seeks on the unique index (design, number), whatever the page and the design's size
 * (no OFFSET walk, no count). Revision n is on page floor((latest − n) / 100) + 1 (revisionPageOf).
 */
export function listRevisionPage(db: Db, designId: number, page: number) {
  const total = latestRevisionNumber(db, designId) ?? 0;
  const w = pageWindow(total, page);
  const rows = revisionPageQuery(db, designId, total - w.offset, w.pageSize).all();
  return { revisions: rows, total, page: w.page, lastPage: w.lastPage, pageSize: w.pageSize };
}

/** The rows of one page: numbers (newest − size, newest], newest first (a test reads its query plan). */
export function revisionPageQuery(db: Db, designId: number, newest: number, size: number) {
  return db
    .select({
      id: revisions.id,
      number: revisions.number,
      baseNumber: revisions.baseNumber,
      // Only the margins of the stored summary (a few hundred bytes of its ~2 kB), read by SQLite.
      margins: sql<string | null>`json_extract(${revisions.summary}, '$.margins')`.mapWith((v: string | null): Margins | null => (v == null ? null : JSON.parse(v))),
      authorId: revisions.authorId,
      authorName: users.name,
      note: revisions.note,
      createdAt: revisions.createdAt,
    })
    .from(revisions)
    .innerJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.designId, designId), lte(revisions.number, newest), gt(revisions.number, newest - size)))
    .orderBy(desc(revisions.number));
}

/** What GET /api/designs/:id/revisions answers: one page, `{ revisions, total, page, lastPage, pageSize }`. */
export type RevisionPage = ReturnType<typeof listRevisionPage>;

/** The history page (newest first, PAGE_SIZE a page) that holds revision `number` of `latest`. */
export const revisionPageOf = (latest: number, number: number) => Math.floor(Math.max(0, latest - number) / PAGE_SIZE) + 1;

/** A revision with its author's name, as the revision routes answer it. */
export type RevisionRow = ReturnType<typeof listRevisions>[number];

export function getLatestRevision(db: Db, designId: number) {
  return db
    .select(revisionColumns)
    .from(revisions)
    .innerJoin(users, eq(users.id, revisions.authorId))
    .where(eq(revisions.designId, designId))
    .orderBy(desc(revisions.number))
    .limit(1)
    .get();
}
