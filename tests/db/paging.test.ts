/**
 * The lists that grow are served a page at a time on the server (100 a page, newest first):
 * a design's revisions (History), a revision's remarks and a member's mailbox.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { addRemark, createDesign, createRevision, createTeam, createUser, listMailPageForMember, listRemarksPage, listRevisionPage, listSignoffStates, revisionPageOf, revisionPageQuery, storeMail } from '@/db/queries';
import { latestRevisionNumber } from '@/db/queries/revisions';
import type { OpenDb } from '@/db/connection';
import { eq, sql } from 'drizzle-orm';
import { memberships, revisions } from '@/db/schema';
import { pageParam, pageWindow } from '@/lib/paging';
import { sampleRevisionBody } from '../support/sample-revision';
import { tempDb } from '../support/temp-db';

let db: OpenDb;
let cleanup: () => void;
let team: number;
let designer: number;
let designId: number;

beforeEach(() => {
  ({ db, cleanup } = tempDb());
  team = createTeam(db, { name: 'T', slug: 't' }).id;
  designer = createUser(db, { email: 'd@example.test', name: 'Dana Designer', password: 'long enough' }).id;
  db.insert(memberships).values({ userId: designer, teamId: team, role: 'designer' }).run();
  designId = createDesign(db, designer, team, { name: 'Rail', topology: 'buck' }).id;
});
afterEach(() => cleanup());

describe('paging', () => {
  it('reads the page from the URL and clamps it to the list', () => {
    expect([pageParam(undefined), pageParam('3'), pageParam('0'), pageParam('-2'), pageParam('x'), pageParam(['2'])]).toEqual([1, 3, 1, 1, 1, 1]);
    expect(pageWindow(250, 9)).toEqual({ page: 3, lastPage: 3, pageSize: 100, offset: 200 });
    expect(pageWindow(0, 1)).toEqual({ page: 1, lastPage: 1, pageSize: 100, offset: 0 });
  });

  it('serves a design\'s revisions 100 a page, newest first, without their input; revision n is on page revisionPageOf', () => {
    const body = sampleRevisionBody();
    db.transaction((tx) => {
      for (let n = 1; n <= 250; n++) createRevision(tx, { teamId: team, designId, baseNumber: n === 1 ? null : n - 1, ...body, authorId: designer, note: `r${n}` });
    });
    const p1 = listRevisionPage(db, designId, 1);
    expect(p1).toMatchObject({ total: 250, page: 1, lastPage: 3, pageSize: 100 });
    expect(p1.revisions.map((r) => r.number).slice(0, 2)).toEqual([250, 249]);
    expect(p1.revisions[0]).not.toHaveProperty('input');
    const p3 = listRevisionPage(db, designId, 7);
    expect(p3.page).toBe(3);
    expect(p3.revisions.map((r) => r.number)).toEqual(Array.from({ length: 50 }, (_, i) => 50 - i));
    for (const n of [250, 151, 150, 51, 50, 1]) {
      const page = listRevisionPage(db, designId, revisionPageOf(250, n));
      expect(page.revisions.some((r) => r.number === n), `r${n}`).toBe(true);
    }
    expect([...listSignoffStates(db, designId, { from: 101, to: 200 }).keys()].sort((a, b) => a - b)).toEqual(Array.from({ length: 100 }, (_, i) => 101 + i));
  });

  it('reads a page of revisions and the total by seeks on the unique index (design, number): no scan, no temporary B-tree for the order', () => {
    const body = sampleRevisionBody();
    const other = createDesign(db, designer, team, { name: 'Other', topology: 'buck' }).id;
    db.transaction((tx) => {
      for (let n = 1; n <= 300; n++) createRevision(tx, { teamId: team, designId, baseNumber: n === 1 ? null : n - 1, ...body, authorId: designer, note: '' });
      for (let n = 1; n <= 50; n++) createRevision(tx, { teamId: team, designId: other, baseNumber: n === 1 ? null : n - 1, ...body, authorId: designer, note: '' });
    });
    db.$client.exec('ANALYZE');
    const plan = (q: { toSQL(): { sql: string; params: unknown[] } }) => {
      const { sql, params } = q.toSQL();
      return (db.$client.prepare(`EXPLAIN QUERY PLAN ${sql}`).all(...params) as { detail: string }[]).map((r) => r.detail).join('\n');
    };
    for (const page of [1, 2, 3]) {
      const p = plan(revisionPageQuery(db, designId, 300 - (page - 1) * 100, 100));
      expect(p, p).toMatch(/SEARCH revisions USING INDEX revisions_design_number \(design_id=\? AND number>\? AND number<\?\)/);
      expect(p, p).not.toMatch(/TEMP B-TREE|SCAN revisions/);
    }
    const latest = plan(db.select({ n: sql`max(${revisions.number})` }).from(revisions).where(eq(revisions.designId, designId)));
    expect(latest, latest).toMatch(/revisions_design_number/);
    expect(latest).not.toMatch(/SCAN revisions/);
    expect(latestRevisionNumber(db, designId)).toBe(300);
    expect(listRevisionPage(db, other, 1)).toMatchObject({ total: 50, lastPage: 1 });
  });

  it('serves a revision\'s remarks 100 a page, newest first', () => {
    const r1 = createRevision(db, { teamId: team, designId, baseNumber: null, ...sampleRevisionBody(), authorId: designer, note: '' });
    for (let i = 1; i <= 130; i++) addRemark(db, { teamId: team, designId, revisionId: r1.id, number: 1, authorId: designer, body: `remark ${i}` });
    const p1 = listRemarksPage(db, r1.id, 1);
    expect(p1).toMatchObject({ total: 130, page: 1, lastPage: 2 });
    expect(p1.remarks).toHaveLength(100);
    expect(p1.remarks[0].body).toBe('remark 130');
    expect(listRemarksPage(db, r1.id, 2).remarks.map((r) => r.body)).toEqual(Array.from({ length: 30 }, (_, i) => `remark ${30 - i}`));
  });

  it('serves a member\'s mail about one team 100 a page, newest first, list columns only', () => {
    for (let i = 1; i <= 120; i++) storeMail(db, { teamId: team, fromAddress: 'noreply@x.test', toAddress: 'd@example.test', subject: `mail ${i}`, text: 't', html: '', raw: 'raw' });
    storeMail(db, { teamId: team + 1, fromAddress: 'noreply@x.test', toAddress: 'd@example.test', subject: 'other team', text: '', html: '', raw: '' });
    const p1 = listMailPageForMember(db, 'D@example.test', team, 1);
    expect(p1).toMatchObject({ total: 120, page: 1, lastPage: 2 });
    expect(p1.messages[0]).toMatchObject({ subject: 'mail 120' });
    expect(p1.messages[0]).not.toHaveProperty('raw');
    expect(listMailPageForMember(db, 'd@example.test', team, 2).messages).toHaveLength(20);
  });
});
