/**
 * Archive, restore and delete a design, and the server-side filters of the designs list:
 * who may (designer and admin; reviewer and viewer 403; 401 without a session; 404 from
 * another team), what archiving keeps (revisions readable and unchanged, saves refused),
 * and that signed-off work is never deleted.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { Client, signedInAs } from '../support/http';
import { otherTeam } from '../support/other-team';
import { savedDesign } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
type RoleName = (typeof ROLES)[number];
const clients = {} as Record<RoleName, Client>;
const ids = {} as Record<RoleName, number>;

async function listNames(c: Client, query = '') {
  const res = await c.fetch(`/api/designs${query}`);
  expect(res.status).toBe(200);
  return ((await res.json()).designs as { name: string }[]).map((d) => d.name);
}

beforeAll(async () => {
  for (const role of ROLES) {
    clients[role] = await signedInAs(baseUrl, role);
    ids[role] = (await (await clients[role].fetch('/api/auth/session')).json()).user.id;
  }
});

describe('archive and restore', () => {
  it('401 without a session, 404 from another team', async () => {
    const { designId } = await savedDesign(clients.designer, 'Archive scope rail');
    expect((await new Client(baseUrl).fetch(`/api/designs/${designId}/archive`, { method: 'POST' })).status).toBe(401);
    const outsider = await otherTeam(baseUrl, dbPath);
    expect((await outsider.client.fetch(`/api/designs/${designId}/archive`, { method: 'POST' })).status).toBe(404);
    expect((await outsider.client.fetch(`/api/designs/${designId}`, { method: 'DELETE' })).status).toBe(404);
  });

  it.each(['reviewer', 'viewer'] as const)('%s may not archive, restore or delete (403)', async (role) => {
    const { designId } = await savedDesign(clients.designer, `Archive refused ${role}`);
    expect((await clients[role].fetch(`/api/designs/${designId}/archive`, { method: 'POST' })).status).toBe(403);
    expect((await clients[role].fetch(`/api/designs/${designId}/archive`, { method: 'DELETE' })).status).toBe(403);
    expect((await clients[role].fetch(`/api/designs/${designId}`, { method: 'DELETE' })).status).toBe(403);
    expect(await listNames(clients[role])).toContain(`Archive refused ${role}`);
  });

  it.each(['designer', 'admin'] as const)('%s archives: hidden from the list, still readable, revisions unchanged, saves refused; then restores', async (role) => {
    const name = `Archived by ${role}`;
    const { designId, input } = await savedDesign(clients.designer, name);
    const before = await (await clients.viewer.fetch(`/api/designs/${designId}/revisions/1`)).json();

    const archived = await clients[role].fetch(`/api/designs/${designId}/archive`, { method: 'POST' });
    expect(archived.status).toBe(200);
    expect((await archived.json()).archivedAt).toEqual(expect.any(String));

    expect(await listNames(clients.viewer)).not.toContain(name);
    expect(await listNames(clients.viewer, '?archived=archived')).toContain(name);
    expect(await listNames(clients.viewer, '?archived=all')).toContain(name);
    expect(await listNames(clients.viewer, '?archived=active')).not.toContain(name);

    // Read-only but whole: the revision reads back the same, byte for byte.
    expect((await clients.viewer.fetch(`/api/designs/${designId}`)).status).toBe(200);
    expect(await (await clients.viewer.fetch(`/api/designs/${designId}/revisions/1`)).json()).toEqual(before);
    const save = await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: 1, note: 'after archive', input });
    expect(save.status).toBe(409);
    expect((await save.json()).error).toMatch(/archived; restore it/);
    expect((await clients.designer.json(`/api/designs/${designId}`, 'PATCH', { description: 'x' })).status).toBe(409);

    const restored = await clients[role].fetch(`/api/designs/${designId}/archive`, { method: 'DELETE' });
    expect(restored.status).toBe(200);
    expect((await restored.json()).archivedAt).toBeNull();
    expect(await listNames(clients.viewer)).toContain(name);
    expect((await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: 1, note: 'after restore', input })).status).toBe(201);
  });

  it('an unknown list filter is a 400 naming the parameter', async () => {
    const res = await clients.viewer.fetch('/api/designs?archived=maybe');
    expect(res.status).toBe(400);
    expect((await res.json()).issues[0].path).toBe('archived');
  });
});

describe('delete', () => {
  it('a design nobody reviewed is deleted for good by its designer (204, then 404)', async () => {
    const { designId } = await savedDesign(clients.designer, 'Mistyped rail');
    expect((await clients.designer.fetch(`/api/designs/${designId}`, { method: 'DELETE' })).status).toBe(204);
    expect((await clients.designer.fetch(`/api/designs/${designId}`)).status).toBe(404);
    expect(await listNames(clients.designer, '?archived=all')).not.toContain('Mistyped rail');
  });

  it('a design with a sign-off trail is kept (409) — submitted or approved — and can be archived instead', async () => {
    const { designId } = await savedDesign(clients.designer, 'Reviewed rail');
    const url = `/api/designs/${designId}/revisions/1`;
    expect((await clients.designer.json(`${url}/submit`, 'POST', { reviewerId: ids.reviewer, message: 'please' })).status).toBe(201);
    const submitted = await clients.admin.fetch(`/api/designs/${designId}`, { method: 'DELETE' });
    expect(submitted.status).toBe(409);
    expect((await submitted.json()).error).toMatch(/archive it instead/);
    expect((await clients.reviewer.json(`${url}/decision`, 'POST', { decision: 'approve', message: 'ok' })).status).toBe(201);
    expect((await clients.designer.fetch(`/api/designs/${designId}`, { method: 'DELETE' })).status).toBe(409);
    expect((await clients.designer.fetch(`/api/designs/${designId}/archive`, { method: 'POST' })).status).toBe(200);
    expect((await clients.viewer.fetch(`${url}/signoff`)).status).toBe(200);
  });
});

describe('waiting for my review', () => {
  it('lists the designs in review that ask me, and drops them once decided', async () => {
    const { designId } = await savedDesign(clients.designer, 'Waiting rail');
    const url = `/api/designs/${designId}/revisions/1`;
    expect(await listNames(clients.reviewer, '?waiting=me')).not.toContain('Waiting rail');
    expect((await clients.designer.json(`${url}/submit`, 'POST', { reviewerId: ids.reviewer, message: 'look' })).status).toBe(201);
    expect(await listNames(clients.reviewer, '?waiting=me')).toContain('Waiting rail');
    expect(await listNames(clients.admin, '?waiting=me')).not.toContain('Waiting rail');
    expect(await listNames(clients.designer, '?waiting=me')).not.toContain('Waiting rail');
    expect((await clients.reviewer.json(`${url}/decision`, 'POST', { decision: 'request-changes', message: 'raise PM' })).status).toBe(201);
    expect(await listNames(clients.reviewer, '?waiting=me')).not.toContain('Waiting rail');
  });

  it('?waiting=anyone is a 400', async () => {
    expect((await clients.reviewer.fetch('/api/designs?waiting=anyone')).status).toBe(400);
  });
});
