/**
 * Issue 2: sign-in through the real next-auth endpoints as each demo role,
 * and the role rules of GET/POST /api/designs (401 / 403 / 2xx / 400).
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { Client, DEMO_PASSWORD, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');
const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
const clients = {} as Record<(typeof ROLES)[number], Client>;

beforeAll(async () => {
  for (const role of ROLES) clients[role] = await signedInAs(baseUrl, role);
});

describe('sign-in', () => {
  it.each(ROLES)('%s signs in and the session carries id and role', async (role) => {
    const res = await clients[role].fetch('/api/auth/session');
    const session = await res.json();
    expect(session.user.email).toBe(`${role}@demo.test`);
    expect(typeof session.user.id).toBe('number');
    expect(session.user.role).toBe(role);
  });

  it('refuses a wrong password', async () => {
    const c = new Client(baseUrl);
    const { signedIn } = await c.signIn('designer@demo.test', 'not-the-password');
    expect(signedIn).toBe(false);
    expect((await c.fetch('/api/designs')).status).toBe(401);
  });

  it('redirects pages to sign-in without a session', async () => {
    const res = await new Client(baseUrl).fetch('/designs');
    expect([302, 303, 307, 308]).toContain(res.status);
    expect(res.headers.get('location')).toMatch(/\/signin/);
  });

  it('serves the sign-in page', async () => {
    const res = await new Client(baseUrl).fetch('/signin');
    expect(res.status).toBe(200);
    expect(DEMO_PASSWORD).toBe('phasewright-demo');
  });
});

describe('GET /api/designs', () => {
  it('401 without a session', async () => {
    const res = await new Client(baseUrl).fetch('/api/designs');
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: expect.any(String) });
  });

  it.each(ROLES)('%s sees the three demo designs of the team', async (role) => {
    const res = await clients[role].fetch('/api/designs');
    expect(res.status).toBe(200);
    const { designs } = await res.json();
    expect(designs.length).toBeGreaterThanOrEqual(3);
    for (const d of designs) expect(d).toMatchObject({ id: expect.any(Number), name: expect.any(String), topology: expect.any(String) });
    expect(new Set(designs.map((d: { topology: string }) => d.topology))).toEqual(new Set(['buck', 'boost', 'buck-boost']));
  });
});

describe('GET /api/designs pages, filters and sorts on the server', () => {
  it('answers one page with the total', async () => {
    const body = await (await clients.viewer.fetch('/api/designs?sort=name&dir=asc&topology=buck')).json();
    expect(body).toMatchObject({ total: expect.any(Number), page: 1, pageSize: 100 });
    expect(body.designs.every((d: { topology: string }) => d.topology === 'buck')).toBe(true);
    const names = body.designs.map((d: { name: string }) => d.name.toLowerCase());
    expect(names).toEqual([...names].sort());
  });

  it('400 naming the parameter that does not fit', async () => {
    const res = await clients.viewer.fetch('/api/designs?sort=colour&page=0');
    expect(res.status).toBe(400);
    const paths = (await res.json()).issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['sort', 'page']));
  });
});

describe('POST /api/designs', () => {
  const body = { name: 'Sensor rail', description: 'made by a test', topology: 'buck' };

  it('401 without a session', async () => {
    expect((await new Client(baseUrl).json('/api/designs', 'POST', body)).status).toBe(401);
  });

  it.each(['reviewer', 'viewer'] as const)('403 for %s', async (role) => {
    const res = await clients[role].json('/api/designs', 'POST', body);
    expect(res.status).toBe(403);
  });

  it.each(['designer', 'admin'] as const)('201 for %s', async (role) => {
    const res = await clients[role].json('/api/designs', 'POST', { ...body, name: `${body.name} by ${role}` });
    expect(res.status).toBe(201);
    const created = await res.json();
    expect(created).toMatchObject({ id: expect.any(Number), name: `Sensor rail by ${role}`, topology: 'buck' });
    const list = await (await clients.viewer.fetch('/api/designs')).json();
    expect(list.designs.map((d: { id: number }) => d.id)).toContain(created.id);
  });

  it('400 naming the field for a malformed body', async () => {
    const res = await clients.designer.json('/api/designs', 'POST', { name: '', topology: 'flyback' });
    expect(res.status).toBe(400);
    const err = await res.json();
    expect(err.error).toEqual(expect.any(String));
    const paths = err.issues.map((i: { path: string }) => i.path);
    expect(paths).toContain('name');
    expect(paths).toContain('topology');
  });

  it('400 for a body that is not JSON', async () => {
    const res = await clients.designer.json('/api/designs', 'POST', '{not json');
    expect(res.status).toBe(400);
    expect((await res.json()).issues[0].path).toBe('(body)');
  });
});

describe('teams', () => {
  it('switches only to a team the user belongs to, and the role follows the team', async () => {
    const c = await signedInAs(baseUrl, 'designer');
    const session = await (await c.fetch('/api/auth/session')).json();
    const home = session.user.teamId as number;
    const homeDesigns = (await (await c.fetch('/api/designs')).json()).designs;

    // Any team id the designer is not in is refused.
    expect((await c.json('/api/session/team', 'POST', { teamId: 999_999 })).status).toBe(403);
    expect((await c.json('/api/session/team', 'POST', { teamId: 'lab' })).status).toBe(400);

    // The second demo team, where the designer only reads.
    const admin = await signedInAs(baseUrl, 'admin');
    const adminTeams = (await (await admin.fetch('/api/auth/session')).json()).user.teamId as number;
    expect(adminTeams).toBe(home);
    let lab: number | null = null;
    for (let id = home + 1; id < home + 5 && lab === null; id++) {
      const res = await c.json('/api/session/team', 'POST', { teamId: id });
      if (res.status === 200) lab = id;
    }
    expect(lab).not.toBeNull();
    const inLab = await (await c.fetch('/api/auth/session')).json();
    expect(inLab.user).toMatchObject({ teamId: lab, role: 'viewer' });
    const labDesigns = (await (await c.fetch('/api/designs')).json()).designs;
    expect(labDesigns.map((d: { id: number }) => d.id)).not.toEqual(expect.arrayContaining(homeDesigns.map((d: { id: number }) => d.id)));
    expect((await c.json('/api/designs', 'POST', { name: 'Not allowed here' })).status).toBe(403);
    // A design of the other team is not found from here.
    expect((await c.fetch(`/api/designs/${homeDesigns[0].id}`)).status).toBe(404);
  });
});
