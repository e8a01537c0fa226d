/**
 * Joining a team is by invitation: an admin invites an address and gets the
 * same answer whether or not it has an account (it used to add any existing
 * account of another team, with any role, at once — and say so). The person
 * accepts through the mailed link: signed in as that address, or by creating
 * the account.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { listMailTo } from '@/db/queries';
import { Client } from '../support/http';
import { otherTeam, OUTSIDER } from '../support/other-team';
import { ownTeam } from '../support/own-team';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let team: Awaited<ReturnType<typeof ownTeam<'admin' | 'designer'>>>;
let outsider: Awaited<ReturnType<typeof otherTeam>>;

beforeAll(async () => {
  team = await ownTeam(baseUrl, dbPath, 'invite-crew', { admin: 'admin', designer: 'designer' });
  outsider = await otherTeam(baseUrl, dbPath);
});

function tokenFromMail(to: string): string {
  const db = openDatabase(dbPath);
  try {
    const mail = listMailTo(db, to).find((m) => m.subject === 'Invitation to Team invite-crew on Phasewright');
    const m = mail?.text.match(/invitations\/accept\?token=([A-Za-z0-9_%-]+)/);
    if (!m) throw new Error(`no invitation mail to ${to}`);
    return decodeURIComponent(m[1]);
  } finally {
    db.$client.close();
  }
}

const members = async () => (await (await team.clients.admin.fetch('/api/team/invitations')).json()).invitations as { email: string }[];

describe('invitations', () => {
  it('the answer is the same for an address with an account and one without', async () => {
    const known = await team.clients.admin.json('/api/team/invitations', 'POST', { email: OUTSIDER.email, role: 'admin' });
    const unknown = await team.clients.admin.json('/api/team/invitations', 'POST', { email: 'nobody-yet@invite.test', role: 'admin' });
    expect(known.status).toBe(201);
    expect(unknown.status).toBe(201);
    const [a, b] = [await known.json(), await unknown.json()];
    expect(Object.keys(a).sort()).toEqual(Object.keys(b).sort());
    expect(a).toEqual({ invited: OUTSIDER.email, role: 'admin' });
    // nobody joined yet: the outsider still sees only their own team
    const session = await (await outsider.client.fetch('/api/auth/session')).json();
    expect(session.user.teamId).toBe(outsider.teamId);
    expect((await members()).map((m) => m.email)).toEqual(expect.arrayContaining([OUTSIDER.email, 'nobody-yet@invite.test']));
  });

  it('only an admin invites', async () => {
    expect((await team.clients.designer.json('/api/team/invitations', 'POST', { email: 'x@invite.test', role: 'viewer' })).status).toBe(403);
  });

  it('an existing account accepts only when signed in as that address', async () => {
    const token = tokenFromMail(OUTSIDER.email);
    const anonymous = await new Client(baseUrl).json('/api/invitations/accept', 'POST', { token });
    expect(anonymous.status).toBe(401);
    const someoneElse = await team.clients.designer.json('/api/invitations/accept', 'POST', { token });
    expect(someoneElse.status).toBe(403);
    const res = await outsider.client.json('/api/invitations/accept', 'POST', { token });
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ teamName: 'Team invite-crew', role: 'admin', accountCreated: false });
    // used once
    expect((await outsider.client.json('/api/invitations/accept', 'POST', { token })).status).toBe(404);
  });

  it('a new address creates its account on accepting', async () => {
    const token = tokenFromMail('nobody-yet@invite.test');
    const noPassword = await new Client(baseUrl).json('/api/invitations/accept', 'POST', { token, name: 'New Person' });
    expect(noPassword.status).toBe(422);
    expect((await noPassword.json()).issues[0].path).toBe('password');
    const res = await new Client(baseUrl).json('/api/invitations/accept', 'POST', { token, name: 'New Person', password: 'new person pw' });
    expect(res.status).toBe(201);
    const c = new Client(baseUrl);
    expect((await c.signIn('nobody-yet@invite.test', 'new person pw')).signedIn).toBe(true);
    expect((await c.fetch('/api/designs')).status).toBe(200);
  });
});
