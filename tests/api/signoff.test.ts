/**
 * Issue 5: sign-off and remarks. Every route × role, without a session and
 * from another team; the rules (nobody approves their own revision, a
 * reviewer must be one, moves the state allows); the full round with the
 * e-mail each step sends, read back from the fake mail server.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { listAudit, listMailTo } from '@/db/queries';
import { Client, signedInAs } from '../support/http';
import { addRemarks } from '../support/many-revisions';
import { otherTeam } from '../support/other-team';
import { savedDesign, tweak, type AnalyzeInput } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
type RoleName = (typeof ROLES)[number];
const clients = {} as Record<RoleName, Client>;
const ids = {} as Record<RoleName, number>;
let outsider: Awaited<ReturnType<typeof otherTeam>>;
let designId: number;
let input: AnalyzeInput;

/** Read the app's database (mail kept by the fake server, audit log). */
function withDb<T>(fn: (db: ReturnType<typeof openDatabase>) => T): T {
  const db = openDatabase(dbPath);
  try {
    return fn(db);
  } finally {
    db.$client.close();
  }
}

const url = (n: number, what: string) => `/api/designs/${designId}/revisions/${n}/${what}`;

/** Save the next revision as `role`; returns its number. */
async function saveNext(role: 'admin' | 'designer' = 'designer') {
  const { revisions } = await (await clients.viewer.fetch(`/api/designs/${designId}/revisions`)).json();
  const base = revisions[0].number; // newest first
  const res = await clients[role].json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: base, note: `by ${role}`, input: tweak(input, 'r1', 1 + base / 10) });
  expect(res.status).toBe(201);
  return (await res.json()).number as number;
}

async function state(n: number) {
  return (await (await clients.viewer.fetch(url(n, 'signoff'))).json()).state as string;
}

beforeAll(async () => {
  for (const role of ROLES) {
    clients[role] = await signedInAs(baseUrl, role);
    ids[role] = (await (await clients[role].fetch('/api/auth/session')).json()).user.id;
  }
  outsider = await otherTeam(baseUrl, dbPath);
  ({ designId, input } = await savedDesign(clients.designer, 'Sign-off test rail'));
});

describe('GET …/signoff and …/remarks', () => {
  it.each(ROLES)('%s reads the state, events and remarks', async (role) => {
    const res = await clients[role].fetch(url(1, 'signoff'));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ number: 1, state: expect.any(String), events: expect.any(Array), remarks: expect.any(Array) });
    expect((await clients[role].fetch(url(1, 'remarks'))).status).toBe(200);
  });

  it('…/signoff carries the newest 100 remarks and their count; …/remarks pages the rest', async () => {
    const { designId: long } = await savedDesign(clients.designer, 'Sign-off remarks paging rail');
    addRemarks(dbPath, long, 1, 130);
    const at = (what: string) => `/api/designs/${long}/revisions/1/${what}`;
    const signoff = await (await clients.viewer.fetch(at('signoff'))).json();
    expect(signoff.remarkTotal).toBe(130);
    expect(signoff.remarks).toHaveLength(100);
    expect(signoff.remarks[0].body).toBe('remark 130');
    const older = await (await clients.viewer.fetch(at('remarks?page=2'))).json();
    expect(older).toMatchObject({ total: 130, page: 2, lastPage: 2, pageSize: 100 });
    expect(older.remarks.map((r: { body: string }) => r.body)).toEqual(Array.from({ length: 30 }, (_, i) => `remark ${30 - i}`));
    for (const bad of ['0', 'x', '2.5']) {
      const res = await clients.viewer.fetch(at(`remarks?page=${bad}`));
      expect(res.status, bad).toBe(400);
      expect((await res.json()).issues).toEqual([expect.objectContaining({ path: 'page' })]);
    }
  });

  it("401 without a session, 404 from another team or for a missing revision", async () => {
    for (const what of ['signoff', 'remarks']) {
      expect((await new Client(baseUrl).fetch(url(1, what))).status).toBe(401);
      expect((await outsider.client.fetch(url(1, what))).status).toBe(404);
      expect((await clients.admin.fetch(url(99, what))).status).toBe(404);
    }
  });
});

describe('POST …/submit', () => {
  it.each(['reviewer', 'viewer'] as const)('%s may not submit (403)', async (role) => {
    const res = await clients[role].json(url(1, 'submit'), 'POST', { reviewerId: ids.admin, message: '' });
    expect(res.status).toBe(403);
  });

  it("401 without a session, 404 from another team", async () => {
    const body = { reviewerId: ids.reviewer, message: '' };
    expect((await new Client(baseUrl).json(url(1, 'submit'), 'POST', body)).status).toBe(401);
    expect((await outsider.client.json(url(1, 'submit'), 'POST', body)).status).toBe(404);
  });

  it('400 naming reviewerId when it is not an id', async () => {
    const res = await clients.designer.json(url(1, 'submit'), 'POST', { reviewerId: 'rui', message: 'hi' });
    expect(res.status).toBe(400);
    expect((await res.json()).issues[0].path).toBe('reviewerId');
  });

  it('422 naming reviewerId for a viewer, the author, an admin (this team does not let admins review), or a user of another team', async () => {
    for (const reviewerId of [ids.viewer, ids.designer, ids.admin, outsider.userId]) {
      const res = await clients.designer.json(url(1, 'submit'), 'POST', { reviewerId, message: '' });
      expect(res.status).toBe(422);
      expect((await res.json()).issues[0].path).toBe('reviewerId');
    }
    expect(await state(1)).toBe('draft');
  });

  it.each(['admin', 'designer'] as const)('%s submits to a reviewer (201, in-review, mail to the reviewer)', async (role) => {
    const n = await saveNext();
    const message = `Please check r${n}, asked by ${role}`;
    const res = await clients[role].json(url(n, 'submit'), 'POST', { reviewerId: ids.reviewer, message });
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ state: 'in-review', mailed: 1 });
    expect(await state(n)).toBe('in-review');
    const mail = withDb((db) => listMailTo(db, 'reviewer@demo.test')).find((m) => m.text.includes(message));
    expect(mail?.subject).toBe(`Review requested: Sign-off test rail r${n}`);
    expect(mail?.text).toContain(`/designs/${designId}/history?r=${n}`);
    expect(mail?.html).toContain(`/designs/${designId}/history?r=${n}`);
    // The reviewer signs off the worst case: the mail states it.
    expect(mail?.text).toMatch(/Worst case over \d+ corners: PM -?\d+\.\d° at .+ of 2,000 simulated builds \(seed 1\) meet PM ≥ 45°/);
    // a revision already in review cannot be submitted again
    const again = await clients[role].json(url(n, 'submit'), 'POST', { reviewerId: ids.reviewer, message: '' });
    expect(again.status).toBe(422);
    expect((await again.json()).issues[0].path).toBe('state');
  });
});

describe('POST …/decision', () => {
  it.each(['designer', 'viewer'] as const)('%s may not decide (403)', async (role) => {
    expect((await clients[role].json(url(1, 'decision'), 'POST', { decision: 'approve', message: '' })).status).toBe(403);
  });

  it("401 without a session, 404 from another team", async () => {
    const body = { decision: 'approve', message: '' };
    expect((await new Client(baseUrl).json(url(1, 'decision'), 'POST', body)).status).toBe(401);
    expect((await outsider.client.json(url(1, 'decision'), 'POST', body)).status).toBe(404);
  });

  it('400 naming decision for an unknown one; 422 naming state on a draft', async () => {
    const bad = await clients.reviewer.json(url(1, 'decision'), 'POST', { decision: 'maybe' });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues[0].path).toBe('decision');
    const draft = await clients.reviewer.json(url(1, 'decision'), 'POST', { decision: 'approve', message: '' });
    expect(draft.status).toBe(422);
    expect((await draft.json()).issues[0].path).toBe('state');
  });

  it('nobody approves their own revision (403), even an admin', async () => {
    const n = await saveNext('admin');
    expect((await clients.designer.json(url(n, 'submit'), 'POST', { reviewerId: ids.reviewer, message: '' })).status).toBe(201);
    const own = await clients.admin.json(url(n, 'decision'), 'POST', { decision: 'approve', message: '' });
    expect(own.status).toBe(403);
    expect(await state(n)).toBe('in-review');
    // the rest of the policy (named reviewer, admins as reviewers): signoff-policy.test.ts
  });

  it('asking for changes needs a message (422 naming message)', async () => {
    const n = await saveNext();
    await clients.designer.json(url(n, 'submit'), 'POST', { reviewerId: ids.reviewer, message: '' });
    const res = await clients.reviewer.json(url(n, 'decision'), 'POST', { decision: 'request-changes', message: ' ' });
    expect(res.status).toBe(422);
    expect((await res.json()).issues[0].path).toBe('message');
  });
});

describe('POST …/remarks', () => {
  it.each(['admin', 'designer', 'reviewer'] as const)('%s adds a remark (201)', async (role) => {
    const res = await clients[role].json(url(1, 'remarks'), 'POST', { body: `A remark from the ${role}` });
    expect(res.status).toBe(201);
    const answer = await (await clients.viewer.fetch(url(1, 'remarks'))).json();
    expect(answer.remarks[0].body).toBe(`A remark from the ${role}`); // newest first
    expect(answer).toMatchObject({ page: 1, pageSize: 100 });
    expect(answer.total).toBeGreaterThanOrEqual(answer.remarks.length);
    const past = await (await clients.viewer.fetch(`${url(1, 'remarks')}?page=999`)).json();
    expect(past.page).toBe(past.lastPage); // a page past the end serves the last one
  });

  it('viewer may not (403); no session 401; another team 404; empty body 400', async () => {
    expect((await clients.viewer.json(url(1, 'remarks'), 'POST', { body: 'hi' })).status).toBe(403);
    expect((await new Client(baseUrl).json(url(1, 'remarks'), 'POST', { body: 'hi' })).status).toBe(401);
    expect((await outsider.client.json(url(1, 'remarks'), 'POST', { body: 'hi' })).status).toBe(404);
    const empty = await clients.reviewer.json(url(1, 'remarks'), 'POST', { body: '   ' });
    expect(empty.status).toBe(400);
    expect((await empty.json()).issues[0].path).toBe('body');
  });
});

describe('a full round: submit → changes requested → submit → approved', () => {
  it('moves through the states, mails the designer each decision, and audits every event', async () => {
    const n = await saveNext('designer');
    const rev = `Sign-off test rail r${n}`;
    const before = withDb((db) => listMailTo(db, 'designer@demo.test').length);

    expect((await clients.designer.json(url(n, 'submit'), 'POST', { reviewerId: ids.reviewer, message: 'First look' })).status).toBe(201);
    const changes = await clients.reviewer.json(url(n, 'decision'), 'POST', { decision: 'request-changes', message: 'Phase margin is thin at high line' });
    expect(changes.status).toBe(201);
    expect(await changes.json()).toMatchObject({ state: 'changes-requested', mailed: 1 });
    expect(await state(n)).toBe('changes-requested');

    expect((await clients.designer.json(url(n, 'submit'), 'POST', { reviewerId: ids.reviewer, message: 'Explained in a remark' })).status).toBe(201);
    const approve = await clients.reviewer.json(url(n, 'decision'), 'POST', { decision: 'approve', message: 'Good to go' });
    expect(approve.status).toBe(201);
    expect(await state(n)).toBe('approved');

    const mail = withDb((db) => listMailTo(db, 'designer@demo.test'));
    expect(mail.length - before).toBe(2);
    const [approved, changed] = mail;
    expect(changed.subject).toBe(`Changes requested: ${rev}`);
    expect(changed.text).toContain('Phase margin is thin at high line');
    expect(approved.subject).toBe(`Approved: ${rev}`);
    expect(approved.text).toContain('Rui Reviewer approved');
    expect(approved.html).toContain(`/designs/${designId}/history?r=${n}`);

    const { events } = await (await clients.viewer.fetch(url(n, 'signoff'))).json();
    expect(events.map((e: { state: string }) => e.state)).toEqual(['in-review', 'changes-requested', 'in-review', 'approved']);

    // the designs list shows the latest revision's state
    const { designs } = await (await clients.viewer.fetch('/api/designs')).json();
    expect(designs.find((d: { id: number }) => d.id === designId).signoffState).toBe('approved');

    const audited = withDb((db) => listAudit(db, (db.$client.prepare('SELECT team_id AS t FROM designs WHERE id = ?').get(designId) as { t: number }).t, 500));
    const forThis = audited.filter((a) => a.action.startsWith('signoff.') && (a.detail as { number?: number }).number === n && (a.detail as { designId?: number }).designId === designId);
    expect(forThis.map((a) => a.action).reverse()).toEqual(['signoff.in-review', 'signoff.changes-requested', 'signoff.in-review', 'signoff.approved']);
    expect(forThis.every((a) => a.userId !== null)).toBe(true);
  });
});
