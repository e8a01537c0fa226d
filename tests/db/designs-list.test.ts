/**
 * The designs list pages, filters and sorts in SQL: the mirrored latest revision and sign-off
 * state follow saves and sign-off events, and every sort reads an index (no sort of the
 * whole team per request).
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { createDesign, createRevision, createTeam, deleteDesign, listDesignsPage, setDesignArchived, submitForReview, teamListState, updateDesign } from '@/db/queries';
import { designsListJson, designsListView } from '@/lib/designs-list-cache';
import type { Db } from '@/db/connection';
import { designs, memberships, users } from '@/db/schema';
import { DESIGN_SORTS, designListQuerySchema, type DesignListQuery } from '@/lib/validation/design';
import { sampleRevisionBody } from '../support/sample-revision';
import { tempDb } from '../support/temp-db';
import { createTestUser } from '../support/users';

let db: Db;
let cleanup: () => void;
let team: number;
let other: number;
let designer: number;
let reviewer: number;
const q = (over: Partial<DesignListQuery> = {}): DesignListQuery => ({ ...designListQuerySchema.parse({}), ...over });

beforeEach(() => {
  ({ db, cleanup } = tempDb());
  team = createTeam(db, { name: 'T', slug: 't' }).id;
  other = createTeam(db, { name: 'O', slug: 'o' }).id;
  designer = createTestUser(db, { email: 'd@example.test', name: 'Dana Designer', password: 'long enough' }).id;
  reviewer = createTestUser(db, { email: 'r@example.test', name: 'Remy Reviewer', password: 'long enough' }).id;
  db.insert(memberships).values({ userId: designer, teamId: team, role: 'designer' }).run();
  db.insert(memberships).values({ userId: reviewer, teamId: team, role: 'reviewer' }).run();
  // 250 designs in the team, 5 in another team; updated_at spread so the order is known.
  const topologies = ['buck', 'boost', 'buck-boost'] as const;
  // One transaction: the insert triggers still run per row, the file is synced once.
  db.transaction((tx) => {
    for (let i = 0; i < 250; i++)
      tx.insert(designs)
        .values({ teamId: team, ownerId: designer, name: `Rail ${String(i).padStart(3, '0')}`, description: i % 10 === 0 ? 'for 100% load' : '', topology: topologies[i % 3], updatedAt: new Date(1e12 + i * 1000) })
        .run();
  });
  for (let i = 0; i < 5; i++) createDesign(db, designer, other, { name: `Other ${i}`, topology: 'buck' });
});
afterEach(() => cleanup());

describe('listDesignsPage', () => {
  it('serves 100 rows a page, newest first, and clamps a page past the end', () => {
    const p1 = listDesignsPage(db, team, q());
    expect(p1).toMatchObject({ total: 250, page: 1, pageSize: 100 });
    expect(p1.designs).toHaveLength(100);
    expect(p1.designs[0].name).toBe('Rail 249');
    const p3 = listDesignsPage(db, team, q({ page: 3 }));
    expect(p3.designs).toHaveLength(50);
    expect(p3.designs.at(-1)?.name).toBe('Rail 000');
    expect(listDesignsPage(db, team, q({ page: 99 })).page).toBe(3);
  });

  it('filters by text (name, description, owner; % taken literally), topology and state', () => {
    expect(listDesignsPage(db, team, q({ q: 'rail 12' })).total).toBe(10); // 120–129
    expect(listDesignsPage(db, team, q({ q: '100%' })).total).toBe(25);
    expect(listDesignsPage(db, team, q({ q: '%' })).total).toBe(25);
    expect(listDesignsPage(db, team, q({ q: 'dana' })).total).toBe(250);
    expect(listDesignsPage(db, team, q({ topology: 'boost' })).total).toBe(83);
    expect(listDesignsPage(db, team, q({ status: 'unsaved' })).total).toBe(250);
    expect(listDesignsPage(db, team, q({ status: 'draft' })).total).toBe(0);
    expect(listDesignsPage(db, other, q()).total).toBe(5);
  });

  it('mirrors the latest revision and its sign-off state', () => {
    const id = listDesignsPage(db, team, q({ q: 'Rail 007' })).designs[0].id;
    const r1 = createRevision(db, { teamId: team, designId: id, baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' });
    expect(listDesignsPage(db, team, q({ status: 'draft' })).designs.map((d) => [d.id, d.latestRevision])).toEqual([[id, 1]]);
    submitForReview(db, { teamId: team, designId: id, revisionId: r1.id, number: 1 }, { actorId: designer, reviewerId: reviewer, message: '' });
    expect(listDesignsPage(db, team, q({ status: 'in-review' })).designs[0]).toMatchObject({ id, signoffState: 'in-review' });
    createRevision(db, { teamId: team, designId: id, baseNumber: 1, ...sampleRevisionBody(), authorId: designer, note: '' });
    expect(listDesignsPage(db, team, q({ status: 'draft' })).designs[0]).toMatchObject({ id, latestRevision: 2, signoffState: 'draft' });
    expect(listDesignsPage(db, team, q({ sort: 'latestRevision', dir: 'desc' })).designs[0].id).toBe(id);
  });

  it('sorts by every column both ways, ties broken by id', () => {
    expect(listDesignsPage(db, team, q({ sort: 'name', dir: 'asc' })).designs[0].name).toBe('Rail 000');
    expect(listDesignsPage(db, team, q({ sort: 'name', dir: 'desc' })).designs[0].name).toBe('Rail 249');
    const byTopology = listDesignsPage(db, team, q({ sort: 'topology', page: 3 })).designs;
    expect(byTopology.at(-1)?.topology).toBe('buck-boost');
  });

  it('keeps the counters (design_counts) equal to a count of the rows through saves, sign-off, archive, edits and deletes', () => {
    const ids = listDesignsPage(db, team, q({ sort: 'name', dir: 'asc' })).designs.map((d) => d.id);
    const r1 = createRevision(db, { teamId: team, designId: ids[0], baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' });
    createRevision(db, { teamId: team, designId: ids[1], baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' });
    submitForReview(db, { teamId: team, designId: ids[0], revisionId: r1.id, number: 1 }, { actorId: designer, reviewerId: reviewer, message: '' });
    setDesignArchived(db, designer, team, ids[2], true);
    setDesignArchived(db, designer, team, ids[3], true);
    setDesignArchived(db, designer, team, ids[3], false);
    db.update(designs).set({ topology: 'boost' }).where(eq(designs.id, ids[4])).run(); // no route changes it; the trigger must follow anyway
    updateDesign(db, designer, team, ids[6], { name: 'Renamed' });
    expect(deleteDesign(db, designer, team, ids[5])).toBe(true);
    createDesign(db, designer, team, { name: 'New one', topology: 'buck-boost' });
    const counted = (where: string) => db.get<{ n: number }>(sql.raw(`SELECT count(*) AS n FROM designs d WHERE d.team_id = ${team} AND ${where}`))!.n;
    const archivedWhere = { active: 'd.archived_at IS NULL', archived: 'd.archived_at IS NOT NULL', all: '1' } as const;
    for (const archived of ['active', 'archived', 'all'] as const)
      for (const topology of ['all', 'buck', 'boost', 'buck-boost'] as const)
        for (const status of ['all', 'unsaved', 'draft', 'in-review', 'approved'] as const) {
          const where: string[] = [archivedWhere[archived]];
          if (topology !== 'all') where.push(`d.topology = '${topology}'`);
          if (status === 'unsaved') where.push('d.latest_revision IS NULL');
          else if (status !== 'all') where.push(`d.signoff_state = '${status}'`);
          expect(listDesignsPage(db, team, q({ archived, topology, status })).total, `${archived} ${topology} ${status}`).toBe(counted(where.join(' AND ')));
        }
    expect(listDesignsPage(db, team, q()).total).toBe(249);
    expect(listDesignsPage(db, team, q({ status: 'in-review' })).total).toBe(1);
  });

  it('counts the list without scanning the team (a sum over design_counts)', () => {
    const plan = db
      .all<{ detail: string }>(sql.raw(`EXPLAIN QUERY PLAN SELECT sum(n) FROM design_counts WHERE team_id = ${team} AND archived = 0`))
      .map((r) => r.detail)
      .join('\n');
    expect(plan).toMatch(/design_counts/);
    expect(plan).not.toMatch(/designs_team/);
  });

  it.each(DESIGN_SORTS)('sorting by %s reads an index, not a temporary sort', (sort) => {
    const column = { name: 'name COLLATE NOCASE', topology: 'topology', latestRevision: 'latest_revision', signoffState: 'signoff_state', updatedAt: 'updated_at' }[sort];
    const plan = db
      .all<{ detail: string }>(sql.raw(`EXPLAIN QUERY PLAN SELECT d.id FROM designs d JOIN users u ON u.id = d.owner_id WHERE d.team_id = 1 ORDER BY d.${column} DESC, d.id DESC LIMIT 100`))
      .map((r) => r.detail)
      .join('\n');
    expect(plan).toMatch(/USING INDEX designs_team_/);
    expect(plan).not.toMatch(/TEMP B-TREE/);
  });

  it("bumps the team's list version on every change the list shows, and only that team's", () => {
    const ids = listDesignsPage(db, team, q({ sort: 'name', dir: 'asc' })).designs.map((d) => d.id);
    const version = () => teamListState(db, team).listVersion;
    const changes: [string, () => unknown][] = [
      ['new design', () => createDesign(db, designer, team, { name: 'Fresh', topology: 'buck' })],
      ['rename', () => updateDesign(db, designer, team, ids[0], { name: 'Renamed' })],
      ['first save', () => createRevision(db, { teamId: team, designId: ids[1], baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' })],
      ['archive', () => setDesignArchived(db, designer, team, ids[2], true)],
      ['owner renamed', () => db.update(users).set({ name: 'Dana D. Designer' }).where(eq(users.id, designer)).run()],
      ['delete', () => deleteDesign(db, designer, team, ids[3])],
    ];
    for (const [what, change] of changes) {
      const before = version();
      change();
      expect(version(), what).toBeGreaterThan(before);
    }
    const r = createRevision(db, { teamId: team, designId: ids[4], baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' });
    const before = version();
    submitForReview(db, { teamId: team, designId: ids[4], revisionId: r.id, number: 1 }, { actorId: designer, reviewerId: reviewer, message: '' });
    expect(version(), 'sign-off event').toBeGreaterThan(before);
    // Another team's version moves only for what it shows (the designer owns designs there too).
    const otherVersion = teamListState(db, other).listVersion;
    updateDesign(db, designer, team, ids[5], { name: 'Only here' });
    expect(teamListState(db, other).listVersion).toBe(otherVersion);
    db.update(users).set({ name: 'Dana Again' }).where(eq(users.id, designer)).run();
    expect(teamListState(db, other).listVersion).toBeGreaterThan(otherVersion);
  });

  it('the cached list page and counts are never stale: a rename, an owner rename, a submission and a new design show at once', () => {
    const viewer = { teamId: team, userId: reviewer, role: 'reviewer' as const };
    const page = (over: Partial<DesignListQuery> = {}) => JSON.parse(designsListJson(db, viewer, q({ sort: 'name', dir: 'asc', ...over })));
    const first = page();
    expect(page()).toEqual(first);
    const id = first.designs[0].id;
    updateDesign(db, designer, team, id, { name: 'Aardvark rail' });
    expect(page().designs[0].name).toBe('Aardvark rail');
    db.update(users).set({ name: 'Dana Renamed' }).where(eq(users.id, designer)).run();
    expect(page().designs[0].ownerName).toBe('Dana Renamed');
    expect(page({ waiting: 'me' }).total).toBe(0);
    expect(designsListView(db, viewer, q())).toMatchObject({ count: 250, waitingCount: 0 });
    const r = createRevision(db, { teamId: team, designId: id, baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' });
    submitForReview(db, { teamId: team, designId: id, revisionId: r.id, number: 1 }, { actorId: designer, reviewerId: reviewer, message: '' });
    expect(page({ waiting: 'me' }).total).toBe(1);
    createDesign(db, designer, team, { name: 'One more', topology: 'boost' });
    expect(designsListView(db, viewer, q())).toMatchObject({ count: 251, waitingCount: 1, reviewsUnnamed: true });
    // Another viewer's "waiting for me" is theirs, not the reviewer's cached page.
    expect(JSON.parse(designsListJson(db, { teamId: team, userId: designer, role: 'designer' }, q({ waiting: 'me' }))).total).toBe(0);
  });
});
