/**
 * Issue 5: revisions are immutable and never lost. Every revision route ×
 * role, without a session and from another team; the save conflict (two
 * saves from one base → 201 + 409, then "save anyway"); the database refusing
 * an UPDATE of a revision row; the list 100 a page (a design with 250 revisions).
 */
import Database from 'better-sqlite3';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { Client, signedInAs } from '../support/http';
import { otherTeam } from '../support/other-team';
import { addRevisions } from '../support/many-revisions';
import { savedDesign, tweak, type AnalyzeInput } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
const clients = {} as Record<(typeof ROLES)[number], Client>;
let outsider: Awaited<ReturnType<typeof otherTeam>>;
let designId: number;
let input: AnalyzeInput;

beforeAll(async () => {
  for (const role of ROLES) clients[role] = await signedInAs(baseUrl, role);
  outsider = await otherTeam(baseUrl, dbPath);
  ({ designId, input } = await savedDesign(clients.designer, 'Revision routes test rail'));
});

const latest = async () => (await (await clients.viewer.fetch(`/api/designs/${designId}`)).json()).latestRevision as number;

describe('GET /api/designs/[id]/revisions', () => {
  it.each(ROLES)('%s lists the revisions with author and margins', async (role) => {
    const res = await clients[role].fetch(`/api/designs/${designId}/revisions`);
    expect(res.status).toBe(200);
    const { revisions, total } = await res.json();
    const r1 = revisions.find((r: { number: number }) => r.number === 1);
    expect(r1).toMatchObject({ number: 1, authorName: 'Dara Designer', note: 'first' });
    expect(r1.margins).toHaveProperty('phaseMarginDeg');
    expect(r1).not.toHaveProperty('input');
    expect(revisions).toHaveLength(total);
  });

  it('401 without a session', async () => {
    expect((await new Client(baseUrl).fetch(`/api/designs/${designId}/revisions`)).status).toBe(401);
  });

  it("404 for another team's user, and for us on their design", async () => {
    expect((await outsider.client.fetch(`/api/designs/${designId}/revisions`)).status).toBe(404);
    expect((await clients.admin.fetch(`/api/designs/${outsider.designId}/revisions`)).status).toBe(404);
  });
});

describe('GET /api/designs/[id]/revisions?page=N (a design with 250 revisions)', () => {
  let long: number;
  const page = async (q: string, role: (typeof ROLES)[number] = 'viewer') => clients[role].fetch(`/api/designs/${long}/revisions${q}`);
  beforeAll(async () => {
    long = (await savedDesign(clients.designer, 'Revision paging test rail')).designId;
    expect(addRevisions(dbPath, long, 249)).toBe(250);
  });

  it('serves 100 a page, newest first, with total and lastPage; a viewer may read every page', async () => {
    const p1 = await (await page('')).json();
    expect(p1).toMatchObject({ total: 250, page: 1, lastPage: 3, pageSize: 100 });
    expect(p1.revisions.map((r: { number: number }) => r.number)).toEqual(Array.from({ length: 100 }, (_, i) => 250 - i));
    expect(p1.revisions[0]).toMatchObject({ note: 'bulk r250', authorName: 'Dara Designer' });
    const p2 = await (await page('?page=2')).json();
    expect(p2).toMatchObject({ total: 250, page: 2, lastPage: 3 });
    expect(p2.revisions.map((r: { number: number }) => r.number)).toEqual(Array.from({ length: 100 }, (_, i) => 150 - i));
    const p3 = await (await page('?page=3')).json();
    expect(p3.revisions.map((r: { number: number }) => r.number)).toEqual(Array.from({ length: 50 }, (_, i) => 50 - i));
  });

  it('a page past the end serves the last page and says so', async () => {
    const res = await page('?page=40');
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ page: 3, lastPage: 3 });
    expect(body.revisions.at(-1).number).toBe(1);
  });

  it.each(['0', '-1', '1.5', 'two', ''])('page=%j → 400 naming page (as GET /api/designs)', async (value) => {
    const res = await page(`?page=${value}`);
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error).toEqual(expect.any(String));
    expect(body.issues).toEqual([expect.objectContaining({ path: 'page', message: expect.stringMatching(/page/) })]);
  });

  it("404 for another team's user on any page", async () => {
    expect((await outsider.client.fetch(`/api/designs/${long}/revisions?page=2`)).status).toBe(404);
  });
});

describe('GET /api/designs/[id]/revisions/[number]', () => {
  it.each(ROLES)('%s reads r1 with its input and summary', async (role) => {
    const res = await clients[role].fetch(`/api/designs/${designId}/revisions/1`);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ number: 1, baseNumber: null });
    expect(body.input.converter).toEqual(expect.objectContaining({ topology: input.converter.topology }));
  });

  it('404 for a number that does not exist, or is not a number', async () => {
    expect((await clients.viewer.fetch(`/api/designs/${designId}/revisions/999`)).status).toBe(404);
    expect((await clients.viewer.fetch(`/api/designs/${designId}/revisions/r1`)).status).toBe(404);
  });

  it("401 without a session, 404 for another team's user", async () => {
    expect((await new Client(baseUrl).fetch(`/api/designs/${designId}/revisions/1`)).status).toBe(401);
    expect((await outsider.client.fetch(`/api/designs/${designId}/revisions/1`)).status).toBe(404);
    expect((await clients.designer.fetch(`/api/designs/${outsider.designId}/revisions/1`)).status).toBe(404);
  });

  it.each(['PUT', 'PATCH', 'DELETE'])('no route edits or deletes a revision (%s → 405)', async (method) => {
    const res = await clients.admin.json(`/api/designs/${designId}/revisions/1`, method, { note: 'rewritten' });
    expect(res.status).toBe(405);
    const again = await (await clients.admin.fetch(`/api/designs/${designId}/revisions/1`)).json();
    expect(again.note).toBe('first');
  });
});

describe('POST /api/designs/[id]/revisions', () => {
  it.each(['admin', 'designer'] as const)('%s saves the next revision (201 with its number and margins)', async (role) => {
    const base = await latest();
    const res = await clients[role].json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: base, note: `by ${role}`, input: tweak(input) });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body).toMatchObject({ number: base + 1, baseRevision: base, note: `by ${role}` });
    expect(body.summary.margins).toHaveProperty('crossoverHz');
  });

  it.each(['reviewer', 'viewer'] as const)('%s may not save (403)', async (role) => {
    const res = await clients[role].json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: await latest(), note: '', input });
    expect(res.status).toBe(403);
    expect((await res.json()).error).toMatch(role);
  });

  it("401 without a session, 404 for another team's user", async () => {
    const body = { baseRevision: 1, note: '', input };
    expect((await new Client(baseUrl).json(`/api/designs/${designId}/revisions`, 'POST', body)).status).toBe(401);
    expect((await outsider.client.json(`/api/designs/${designId}/revisions`, 'POST', body)).status).toBe(404);
  });

  it('400 naming the field for a body that does not fit', async () => {
    const res = await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', {
      baseRevision: 'latest',
      input: { ...input, converter: { ...input.converter, vin: 'twelve' } },
    });
    expect(res.status).toBe(400);
    const paths = (await res.json()).issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['baseRevision', 'input.converter.vin']));
    expect((await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', '{not json')).status).toBe(400);
  });

  it('422 naming the field for a physically impossible design', async () => {
    const res = await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', {
      baseRevision: await latest(),
      note: '',
      input: { ...input, converter: { ...input.converter, l: -1e-6 } },
    });
    expect(res.status).toBe(422);
    expect((await res.json()).issues.map((i: { path: string }) => i.path).join(' ')).toMatch(/\bl\b/);
  });
});

describe('two saves from one base', () => {
  it('one answers 201, the other 409 naming base and latest; "save anyway" keeps both', async () => {
    const base = await latest();
    const save = (c: Client, note: string, factor: number) =>
      c.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: base, note, input: tweak(input, 'r1', factor) });
    const [a, b] = await Promise.all([save(clients.designer, 'designer edit', 0.9), save(clients.admin, 'admin edit', 1.1)]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const [won, lost] = a.status === 201 ? [a, b] : [b, a];
    const wonBody = await won.json();
    const conflict = await lost.json();
    expect(conflict).toMatchObject({ error: expect.any(String), baseRevision: base, latestRevision: base + 1 });
    expect(wonBody.number).toBe(base + 1);

    const loser = lost === a ? clients.designer : clients.admin;
    const loserNote = lost === a ? 'designer edit' : 'admin edit';
    const anyway = await loser.json(`/api/designs/${designId}/revisions`, 'POST', {
      baseRevision: conflict.latestRevision,
      note: loserNote,
      input: tweak(input, 'r1', lost === a ? 0.9 : 1.1),
    });
    expect(anyway.status).toBe(201);
    expect((await anyway.json()).number).toBe(base + 2);

    const { revisions } = await (await clients.viewer.fetch(`/api/designs/${designId}/revisions`)).json();
    const notes = revisions.filter((r: { number: number }) => r.number > base).map((r: { note: string }) => r.note);
    expect(notes.sort()).toEqual(['admin edit', 'designer edit']);
  });

  it('a stale base after "save anyway" is still a conflict', async () => {
    const res = await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: 1, note: '', input });
    expect(res.status).toBe(409);
    expect(await res.json()).toMatchObject({ baseRevision: 1, latestRevision: await latest() });
  });
});

describe('the database itself', () => {
  it('refuses an UPDATE of a revision row', () => {
    const db = new Database(dbPath);
    try {
      const row = db.prepare('SELECT id, note FROM revisions WHERE design_id = ? AND number = 1').get(designId) as { id: number; note: string };
      expect(() => db.prepare("UPDATE revisions SET note = 'rewritten' WHERE id = ?").run(row.id)).toThrow(/immutable/);
      expect((db.prepare('SELECT note FROM revisions WHERE id = ?').get(row.id) as { note: string }).note).toBe('first');
    } finally {
      db.close();
    }
  });
});
