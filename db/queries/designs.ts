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
}

/** Designs of one team with their latest revision number and its sign-off state. */
export function listDesigns(db: Db, teamId: number): DesignListItem[] {
  // Written as SQL: two correlated sub-queries read clearer than the builder here.
  const rows = db.all<
    Omit<DesignListItem, 'createdAt' | 'updatedAt'> & { createdAt: number; updatedAt: number }
  >(sql`SELECT d.id, d.name, d.description, d.topology, d.owner_id AS ownerId, u.name AS ownerName,
              d.created_at AS createdAt, d.updated_at AS updatedAt,
              (SELECT MAX(r.number) FROM revisions r WHERE r.design_id = d.id) AS latestRevision,
              (SELECT e.state FROM signoff_events e JOIN revisions r2 ON r2.id = e.revision_id
                 WHERE r2.design_id = d.id
                   AND r2.number = (SELECT MAX(r3.number) FROM revisions r3 WHERE r3.design_id = d.id)
                 ORDER BY e.id DESC LIMIT 1) AS signoffState
         FROM designs d JOIN users u ON u.id = d.owner_id
        WHERE d.team_id = ${teamId}
        ORDER BY d.updated_at DESC, d.id DESC`);
  return rows.map((r) => ({
    ...r,
    // A saved revision with no sign-off event yet is a draft.
    signoffState: r.signoffState ?? (r.latestRevision ? 'draft' : null),
    createdAt: new Date(r.createdAt).toISOString(),
    updatedAt: new Date(r.updatedAt).toISOString(),
  }));
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

