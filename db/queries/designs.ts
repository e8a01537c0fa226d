import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../connection';
import { designs, teams, type SignoffState } from '../schema';
import { writeAudit } from './audit';
import { DESIGN_PAGE_SIZE, defaultSortDir, type DesignListQuery, type DesignSort } from '@/lib/designs-list-query';

export type Topology = 'buck' | 'boost' | 'buck-boost';

export interface DesignListItem {
  id: number;
  name: string;
  description: string;
  topology: Topology;
  ownerId: number;
  ownerName: string;
  latestRevision: number | null;
  signoffState: SignoffState | null;
  createdAt: string;
  updatedAt: string;
  /** When archived, else null. */
  archivedAt: string | null;
}

type ListRow = Omit<DesignListItem, 'createdAt' | 'updatedAt' | 'archivedAt'> & { createdAt: number; updatedAt: number; archivedAt: number | null };

const LIST_COLUMNS = sql`d.id, d.name, d.description, d.topology, d.owner_id AS ownerId, u.name AS ownerName,
  d.created_at AS createdAt, d.updated_at AS updatedAt, d.latest_revision AS latestRevision, d.signoff_state AS signoffState,
  d.archived_at AS archivedAt`;

const toListItem = (r: ListRow): DesignListItem => ({
  ...r,
  createdAt: new Date(r.createdAt).toISOString(),
  updatedAt: new Date(r.updatedAt).toISOString(),
  archivedAt: r.archivedAt === null ? null : new Date(r.archivedAt).toISOString(),
});

/** Server-side filters of the designs list beyond the URL's text/topology/status ones. */
export interface DesignListFilter {
  /** 'active' (default): not archived; 'archived': only archived; 'all'. */
  archived?: 'active' | 'archived' | 'all';
  /** Only designs with a revision now in review that waits for this user's decision. */
  waitingForUserId?: number;
  /**
   * With waitingForUserId: whether the user may decide on a submission that names nobody
   * (the sign-off policy's mayReview for their role and team). Default false.
   */
  reviewsUnnamed?: boolean;
}

/**
 * A revision of d is in review waiting for `userId`: its latest sign-off event is 'in-review'
 * naming them, or naming nobody when they may review such (and they neither wrote nor submitted it).
 */
const waitingFor = (userId: number, reviewsUnnamed: boolean) => sql`EXISTS (
  SELECT 1 FROM revisions wr JOIN signoff_events we ON we.revision_id = wr.id
   WHERE wr.design_id = d.id AND we.state = 'in-review'
     AND (we.reviewer_id = ${userId}
          OR (${reviewsUnnamed ? 1 : 0} = 1 AND we.reviewer_id IS NULL AND wr.author_id <> ${userId} AND we.actor_id <> ${userId}))
     AND we.id = (SELECT MAX(we2.id) FROM signoff_events we2 WHERE we2.revision_id = wr.id))`;

function filterParts(f: DesignListFilter) {
  const parts = [];
  const archived = f.archived ?? 'active';
  if (archived === 'active') parts.push(sql`d.archived_at IS NULL`);
  if (archived === 'archived') parts.push(sql`d.archived_at IS NOT NULL`);
  if (f.waitingForUserId !== undefined) parts.push(waitingFor(f.waitingForUserId, f.reviewsUnnamed ?? false));
  return parts;
}

/** Designs of one team, newest change first, archived ones left out unless asked (no paging: seed and tests). */
export function listDesigns(db: Db, teamId: number, filter: DesignListFilter = {}): DesignListItem[] {
  const cond = sql.join([sql`d.team_id = ${teamId}`, ...filterParts(filter)], sql` AND `);
  return db
    .all<ListRow>(sql`SELECT ${LIST_COLUMNS} FROM designs d CROSS JOIN users u ON u.id = d.owner_id
        WHERE ${cond} ORDER BY d.updated_at DESC, d.id DESC`)
    .map(toListItem);
}

// Each sort reads one index of migration designs_list_columns; the row id breaks ties.
// CROSS JOIN keeps designs as the outer loop (SQLite does not reorder it): with few users the
// planner would otherwise start from users and sort the whole team for every page.
const ORDER_COLUMN: Record<DesignSort, string> = {
  name: 'd.name COLLATE NOCASE',
  topology: 'd.topology',
  latestRevision: 'd.latest_revision',
  signoffState: 'd.signoff_state',
  updatedAt: 'd.updated_at',
};

export interface DesignPage {
  designs: DesignListItem[];
  /** Designs matching the filters, all pages. */
  total: number;
  /** The page served (the last one when the asked page is past the end). */
  page: number;
  pageSize: number;
}

/** Who asks, for `waiting=me`: the user and whether the sign-off policy lets them decide unnamed submissions. */
export interface DesignListViewer {
  userId: number;
  reviewsUnnamed: boolean;
}

/**
 * One page of a team's designs, filtered and sorted in SQL on the indexes above, so the cost
 * stays flat with the team's size (the text filter reads the team's rows, never more).
 * `archived` picks active (default) / archived / all; `waiting=me` (needs `viewer`) keeps the
 * designs whose revision in review waits for the viewer, archived or not.
 */
export function listDesignsPage(
  db: Db,
  teamId: number,
  query: DesignListQuery,
  viewer?: DesignListViewer,
  pageSize = DESIGN_PAGE_SIZE,
): DesignPage {
  const waiting = query.waiting === 'me' && viewer !== undefined;
  const where = [
    sql`d.team_id = ${teamId}`,
    ...filterParts({
      // Waiting for me: wherever it is (an archived design in review still waits).
      archived: waiting ? 'all' : (query.archived ?? 'active'),
      waitingForUserId: waiting ? viewer.userId : undefined,
      reviewsUnnamed: waiting && viewer.reviewsUnnamed,
    }),
  ];
  if (query.topology !== 'all') where.push(sql`d.topology = ${query.topology}`);
  if (query.status === 'unsaved') where.push(sql`d.latest_revision IS NULL`);
  else if (query.status !== 'all') where.push(sql`d.signoff_state = ${query.status}`);
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(sql`(d.name LIKE ${like} ESCAPE '\\' OR d.description LIKE ${like} ESCAPE '\\' OR u.name LIKE ${like} ESCAPE '\\')`);
  }
  const cond = sql.join(where, sql` AND `);
  // Without a text filter or waiting=me the total is a sum over the counters kept by triggers
  // (design_counts: a few rows per team); otherwise a count over the matching rows. Every design
  // has an owner, so that count needs the users join only to match the owner's name.
  const from = query.q ? sql`designs d CROSS JOIN users u ON u.id = d.owner_id` : sql`designs d`;
  const total = query.q || waiting ? (db.get<{ n: number }>(sql`SELECT count(*) AS n FROM ${from} WHERE ${cond}`)?.n ?? 0) : countFromCounters(db, teamId, query);
  const lastPage = Math.max(1, Math.ceil(total / pageSize));
  const page = Math.min(query.page, lastPage);
  const dir = sql.raw((query.dir ?? defaultSortDir(query.sort)) === 'asc' ? 'ASC' : 'DESC');
  const rows = db.all<ListRow>(sql`SELECT ${LIST_COLUMNS} FROM designs d CROSS JOIN users u ON u.id = d.owner_id
      WHERE ${cond}
      ORDER BY ${sql.raw(ORDER_COLUMN[query.sort])} ${dir}, d.id ${dir}
      LIMIT ${pageSize} OFFSET ${(page - 1) * pageSize}`);
  return { designs: rows.map(toListItem), total, page, pageSize };
}

/**
 * What the designs list depends on beyond its rows: the team's list version (bumped by triggers
 * on any change the list shows) and its sign-off setting (whether admins review), in one lookup.
 */
export function teamListState(db: Db, teamId: number): { listVersion: number; adminsMayReview: boolean } {
  const row = db.select({ listVersion: teams.listVersion, adminsMayReview: teams.adminsMayReview }).from(teams).where(eq(teams.id, teamId)).get();
  return { listVersion: row?.listVersion ?? 0, adminsMayReview: row?.adminsMayReview ?? false };
}

/** The designs matching the list's bucket filters (archived, topology, status), from design_counts. */
function countFromCounters(db: Db, teamId: number, query: DesignListQuery): number {
  const where = [sql`team_id = ${teamId}`];
  const archived = query.archived ?? 'active';
  if (archived !== 'all') where.push(sql`archived = ${archived === 'archived' ? 1 : 0}`);
  if (query.topology !== 'all') where.push(sql`topology = ${query.topology}`);
  if (query.status !== 'all') where.push(sql`state = ${query.status}`);
  return db.get<{ n: number | null }>(sql`SELECT sum(n) AS n FROM design_counts WHERE ${sql.join(where, sql` AND `)}`)?.n ?? 0;
}

/** How many designs of the team wait for this user's review (the count beside the filter). */
export function countDesignsWaitingFor(db: Db, teamId: number, userId: number, reviewsUnnamed = false): number {
  return (
    db.get<{ n: number }>(
      sql`SELECT count(*) AS n FROM designs d WHERE ${sql.join([sql`d.team_id = ${teamId}`, ...filterParts({ archived: 'all', waitingForUserId: userId, reviewsUnnamed })], sql` AND `)}`,
    )?.n ?? 0
  );
}

/** Whether any revision of the design was ever submitted or decided (then it is a record). */
export function hasSignoffTrail(db: Db, designId: number): boolean {
  const row = db.get<{ n: number }>(
    sql`SELECT count(*) AS n FROM signoff_events e JOIN revisions r ON r.id = e.revision_id WHERE r.design_id = ${designId}`,
  );
  return (row?.n ?? 0) > 0;
}

/** A design that cannot be deleted (it has a review trail); maps to 409. */
export class DesignDeleteRefusedError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DesignDeleteRefusedError';
  }
}

/** Archive or restore a design (revisions untouched). Undefined outside the team. */
export function setDesignArchived(db: Db, actorId: number, teamId: number, designId: number, archived: boolean) {
  return db.transaction((tx) => {
    const txDb: Db = tx;
    const row = txDb
      .update(designs)
      .set(archived ? { archivedAt: new Date(), archivedBy: actorId } : { archivedAt: null, archivedBy: null })
      .where(and(eq(designs.id, designId), eq(designs.teamId, teamId)))
      .returning()
      .get();
    if (row)
      writeAudit(txDb, {
        teamId,
        userId: actorId,
        action: archived ? 'design.archived' : 'design.restored',
        entityType: 'design',
        entityId: designId,
        detail: { name: row.name },
      });
    return row;
  });
}

/**
 * Delete a design for good: only one nobody has reviewed (no sign-off event on any revision).
 * Anything submitted, decided or approved is a record and can only be archived (a trigger
 * refuses deleting approved work even outside this function). False outside the team.
 */
export function deleteDesign(db: Db, actorId: number, teamId: number, designId: number): boolean {
  return db.transaction(
    (tx) => {
      const txDb: Db = tx;
      const design = getDesign(txDb, teamId, designId);
      if (!design) return false;
      if (hasSignoffTrail(txDb, designId))
        throw new DesignDeleteRefusedError(`“${design.name}” has a sign-off trail, so it is kept as a record: archive it instead`);
      txDb.delete(designs).where(eq(designs.id, designId)).run();
      writeAudit(txDb, { teamId, userId: actorId, action: 'design.deleted', entityType: 'design', entityId: designId, detail: { name: design.name } });
      return true;
    },
    { behavior: 'immediate' },
  );
}

/** One design, only if it belongs to the team (team scoping). */
export function getDesign(db: Db, teamId: number, designId: number) {
  return db
    .select()
    .from(designs)
    .where(and(eq(designs.id, designId), eq(designs.teamId, teamId)))
    .get();
}

export function createDesign(
  db: Db,
  actorId: number,
  teamId: number,
  d: { name: string; description?: string; topology: Topology },
) {
  return db.transaction((tx) => {
    const row = tx
      .insert(designs)
      .values({ teamId, ownerId: actorId, name: d.name.trim(), description: d.description?.trim() ?? '', topology: d.topology })
      .returning()
      .get();
    writeAudit(tx, { teamId, userId: actorId, action: 'design.created', entityType: 'design', entityId: row.id, detail: { name: row.name } });
    return row;
  });
}

export function updateDesign(
  db: Db,
  actorId: number,
  teamId: number,
  designId: number,
  patch: { name?: string; description?: string; designatorMap?: Record<string, string> },
) {
  return db.transaction((tx) => {
    const row = tx
      .update(designs)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(designs.id, designId), eq(designs.teamId, teamId)))
      .returning()
      .get();
    if (row)
      writeAudit(tx, { teamId, userId: actorId, action: 'design.updated', entityType: 'design', entityId: designId, detail: { fields: Object.keys(patch) } });
    return row;
  });
}

export function touchDesign(db: Db, designId: number) {
  db.update(designs).set({ updatedAt: new Date() }).where(eq(designs.id, designId)).run();
}

export function countDesigns(db: Db, teamId: number) {
  return db.select({ n: sql<number>`count(*)` }).from(designs).where(eq(designs.teamId, teamId)).get()?.n ?? 0;
}

