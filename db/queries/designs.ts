import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../connection';
import { designs, type SignoffState } from '../schema';
import { writeAudit } from './audit';

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

/** Server-side filters of the designs list (GET /api/designs and the Designs page read the same). */
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

function filterSql(f: DesignListFilter) {
  const parts = [];
  const archived = f.archived ?? 'active';
  if (archived === 'active') parts.push(sql`d.archived_at IS NULL`);
  if (archived === 'archived') parts.push(sql`d.archived_at IS NOT NULL`);
  if (f.waitingForUserId !== undefined) parts.push(waitingFor(f.waitingForUserId, f.reviewsUnnamed ?? false));
  return parts.length ? sql` AND ${sql.join(parts, sql` AND `)}` : sql``;
}

/** Designs of one team with their latest revision number and its sign-off state (archived ones left out unless asked). */
export function listDesigns(db: Db, teamId: number, filter: DesignListFilter = {}): DesignListItem[] {
  // Written as SQL: two correlated sub-queries read clearer than the builder here.
  const rows = db.all<
    Omit<DesignListItem, 'createdAt' | 'updatedAt' | 'archivedAt'> & { createdAt: number; updatedAt: number; archivedAt: number | null }
  >(sql`SELECT d.id, d.name, d.description, d.topology, d.owner_id AS ownerId, u.name AS ownerName,
              d.created_at AS createdAt, d.updated_at AS updatedAt, d.archived_at AS archivedAt,
              (SELECT MAX(r.number) FROM revisions r WHERE r.design_id = d.id) AS latestRevision,
              (SELECT e.state FROM signoff_events e JOIN revisions r2 ON r2.id = e.revision_id
                 WHERE r2.design_id = d.id
                   AND r2.number = (SELECT MAX(r3.number) FROM revisions r3 WHERE r3.design_id = d.id)
                 ORDER BY e.id DESC LIMIT 1) AS signoffState
         FROM designs d JOIN users u ON u.id = d.owner_id
        WHERE d.team_id = ${teamId}${filterSql(filter)}
        ORDER BY d.updated_at DESC, d.id DESC`);
  return rows.map((r) => ({
    ...r,
    // A saved revision with no sign-off event yet is a draft.
    signoffState: r.signoffState ?? (r.latestRevision ? 'draft' : null),
    createdAt: new Date(r.createdAt).toISOString(),
    updatedAt: new Date(r.updatedAt).toISOString(),
    archivedAt: r.archivedAt === null ? null : new Date(r.archivedAt).toISOString(),
  }));
}

/** How many designs of the team wait for this user's review (the count beside the filter). */
export function countDesignsWaitingFor(db: Db, teamId: number, userId: number, reviewsUnnamed = false): number {
  return (
    db.get<{ n: number }>(
      sql`SELECT count(*) AS n FROM designs d WHERE d.team_id = ${teamId}${filterSql({ archived: 'all', waitingForUserId: userId, reviewsUnnamed })}`,
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

