/**
 * The sign-off policy (lib/signoff-policy.ts) through the routes, on a team of
 * this test's own: the named reviewer decides (not another reviewer); naming
 * nobody lets any reviewer decide; the author never; whoever submitted never;
 * an admin reviews only when the team allows it; only admins change that.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signedInAs } from '../support/http';
import { ownTeam } from '../support/own-team';
import { demoInput, tweak, type AnalyzeInput } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let team: Awaited<ReturnType<typeof ownTeam<'admin' | 'designer' | 'rev1' | 'rev2' | 'viewer'>>>;
let designId: number;
let input: AnalyzeInput;
let next = 1;

const url = (n: number, what: string) => `/api/designs/${designId}/revisions/${n}/${what}`;

async function saveNext(by: 'admin' | 'designer' = 'designer') {
  const res = await team.clients[by].json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: next, note: 'policy', input: tweak(input, 'r1', 1 + next / 10) });
  expect(res.status).toBe(201);
  next = (await res.json()).number;
  return next;
}
const submit = (by: 'admin' | 'designer', n: number, reviewerId: number | null) =>
  team.clients[by].json(url(n, 'submit'), 'POST', { reviewerId, message: '' });
const decide = (by: keyof typeof team.clients, n: number) => team.clients[by].json(url(n, 'decision'), 'POST', { decision: 'approve', message: 'ok' });
const setAdminsMayReview = (value: boolean) => team.clients.admin.json('/api/team/settings', 'PUT', { adminsMayReview: value });

beforeAll(async () => {
  team = await ownTeam(baseUrl, dbPath, 'policy-crew', { admin: 'admin', designer: 'designer', rev1: 'reviewer', rev2: 'reviewer', viewer: 'viewer' });
  input = await demoInput(await signedInAs(baseUrl, 'viewer'));
  const created = await team.clients.designer.json('/api/designs', 'POST', { name: 'Policy rail', topology: input.converter.topology });
  designId = (await created.json()).id;
  expect((await team.clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: null, note: 'first', input })).status).toBe(201);
});

describe('sign-off policy', () => {
  it('only the named reviewer decides: another reviewer gets 403', async () => {
    const n = await saveNext();
    expect((await submit('designer', n, team.ids.rev1)).status).toBe(201);
    const other = await decide('rev2', n);
    expect(other.status).toBe(403);
    expect((await other.json()).error).toMatch(/another reviewer/);
    expect((await decide('rev1', n)).status).toBe(201);
  });

  it('naming nobody lets any reviewer of the team decide', async () => {
    const n = await saveNext();
    expect((await submit('designer', n, null)).status).toBe(201);
    expect((await decide('rev2', n)).status).toBe(201);
  });

  it('the author never decides', async () => {
    await setAdminsMayReview(true);
    try {
      const n = await saveNext('admin');
      expect((await submit('designer', n, null)).status).toBe(201);
      const own = await decide('admin', n);
      expect(own.status).toBe(403);
      expect((await own.json()).error).toMatch(/You wrote/);
    } finally {
      await setAdminsMayReview(false);
    }
  });

  it("an admin may not submit someone else's revision and then approve it", async () => {
    await setAdminsMayReview(true);
    try {
      const n = await saveNext('designer');
      expect((await submit('admin', n, null)).status).toBe(201);
      const res = await decide('admin', n);
      expect(res.status).toBe(403);
      expect((await res.json()).error).toMatch(/submitted/);
    } finally {
      await setAdminsMayReview(false);
    }
  });

  it('an admin reviews only when the team allows it', async () => {
    const n = await saveNext();
    const named = await submit('designer', n, team.ids.admin);
    expect(named.status).toBe(422);
    expect((await named.json()).issues[0].path).toBe('reviewerId');
    expect((await submit('designer', n, null)).status).toBe(201);
    const refused = await decide('admin', n);
    expect(refused.status).toBe(403);
    expect((await refused.json()).error).toMatch(/does not let admins/);
    expect((await setAdminsMayReview(true)).status).toBe(200);
    try {
      expect((await decide('admin', n)).status).toBe(201);
    } finally {
      await setAdminsMayReview(false);
    }
  });

  it('only an admin changes the setting; it is read by every member', async () => {
    expect((await team.clients.designer.json('/api/team/settings', 'PUT', { adminsMayReview: true })).status).toBe(403);
    expect(await (await team.clients.viewer.fetch('/api/team/settings')).json()).toEqual({ adminsMayReview: false });
    const bad = await team.clients.admin.json('/api/team/settings', 'PUT', { adminsMayReview: 'yes' });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues[0].path).toBe('adminsMayReview');
  });
});
