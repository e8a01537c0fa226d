import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../connection';
import { designs, type SignoffState } from '../schema';
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
}

type ListRow = Omit<DesignListItem, 'createdAt' | 'updatedAt'> & { createdAt: number; updatedAt: number };

const LIST_COLUMNS = sql`d.id, d.name, d.description, d.topology, d.owner_id AS ownerId, u.name AS ownerName,
  d.created_at AS createdAt, d.updated_at AS updatedAt, d.latest_revision AS latestRevision, d.signoff_state AS signoffState`;

const toListItem = (r: ListRow): DesignListItem => ({
  ...r,
  createdAt: new Date(r.createdAt).toISOString(),
  updatedAt: new Date(r.updatedAt).toISOString(),
});

/** Every design of one team, newest change first (no paging: seed and tests). */
export function listDesigns(db: Db, teamId: number): DesignListItem[] {
  return db
    .all<ListRow>(sql`SELECT ${LIST_COLUMNS} FROM designs d CROSS JOIN users u ON u.id = d.owner_id
        WHERE d.team_id = ${teamId} ORDER BY d.updated_at DESC, d.id DESC`)
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

/**
 * One page of a team's designs, filtered and sorted in SQL on the indexes above, so the cost
 * stays flat with the team's size (the text filter reads the team's rows, never more).
 */
export function listDesignsPage(db: Db, teamId: number, query: DesignListQuery, pageSize = DESIGN_PAGE_SIZE): DesignPage {
  const where = [sql`d.team_id = ${teamId}`];
  if (query.topology !== 'all') where.push(sql`d.topology = ${query.topology}`);
  if (query.status === 'unsaved') where.push(sql`d.latest_revision IS NULL`);
  else if (query.status !== 'all') where.push(sql`d.signoff_state = ${query.status}`);
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(sql`(d.name LIKE ${like} ESCAPE '\\' OR d.description LIKE ${like} ESCAPE '\\' OR u.name LIKE ${like} ESCAPE '\\')`);
  }
  const cond = sql.join(where, sql` AND `);
  // Every design has an owner, so the count needs the users join only to match the owner's name.
  const from = query.q ? sql`designs d CROSS JOIN users u ON u.id = d.owner_id` : sql`designs d`;
  const total = db.get<{ n: number }>(sql`SELECT count(*) AS n FROM ${from} WHERE ${cond}`)?.n ?? 0;
  const lastPage = Math.max(1, Math.ceil(total / pageSize));
  const page = Math.min(query.page, lastPage);
  const dir = sql.raw((query.dir ?? defaultSortDir(query.sort)) === 'asc' ? 'ASC' : 'DESC');
  const rows = db.all<ListRow>(sql`SELECT ${LIST_COLUMNS} FROM designs d CROSS JOIN users u ON u.id = d.owner_id
      WHERE ${cond}
      ORDER BY ${sql.raw(ORDER_COLUMN[query.sort])} ${dir}, d.id ${dir}
      LIMIT ${pageSize} OFFSET ${(page - 1) * pageSize}`);
  return { designs: rows.map(toListItem), total, page, pageSize };
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

