/**
 * Sessions end on the server: a cookie saved before sign-out, before a
 * password change, or before a removal from the team no longer works
 * (it used to work for 12 h after sign-out).
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { Client } from '../support/http';
import { OWN_TEAM_PASSWORD, ownTeam } from '../support/own-team';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let team: Awaited<ReturnType<typeof ownTeam<'admin' | 'leaver' | 'signsout' | 'changer'>>>;

beforeAll(async () => {
  team = await ownTeam(baseUrl, dbPath, 'session-crew', { admin: 'admin', leaver: 'designer', signsout: 'designer', changer: 'designer' });
});

/** A second client holding a copy of the same session cookie (a cookie saved by someone else). */
async function copyOf(email: string) {
  const c = new Client(baseUrl);
  expect((await c.signIn(email, OWN_TEAM_PASSWORD)).signedIn).toBe(true);
  return c;
}

async function signOut(c: Client) {
  const { csrfToken } = await (await c.fetch('/api/auth/csrf')).json();
  return c.fetch('/api/auth/signout', {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ csrfToken, json: 'true' }),
  });
}

describe('sessions', () => {
  it('sign-out ends the session on the server: a saved cookie stops working', async () => {
    const c = await copyOf(team.emails.signsout);
    expect((await c.fetch('/api/designs')).status).toBe(200);
    // keep the cookie header as it was before signing out
    const cookie = c.cookieHeader();
    await signOut(c);
    const replay = await fetch(`${baseUrl}/api/designs`, { headers: { cookie } });
    expect(replay.status).toBe(401);
    // signing in again works
    expect((await (await copyOf(team.emails.signsout)).fetch('/api/designs')).status).toBe(200);
  });

  it('a password change ends the other sessions (and this one)', async () => {
    const other = await copyOf(team.emails.changer);
    const me = await copyOf(team.emails.changer);
    const wrong = await me.json('/api/account/password', 'POST', { currentPassword: 'not it', newPassword: 'a new password 1' });
    expect(wrong.status).toBe(422);
    expect((await wrong.json()).issues[0].path).toBe('currentPassword');
    const res = await me.json('/api/account/password', 'POST', { currentPassword: OWN_TEAM_PASSWORD, newPassword: 'a new password 1' });
    expect(res.status).toBe(200);
    expect((await other.fetch('/api/designs')).status).toBe(401);
    expect((await me.fetch('/api/designs')).status).toBe(401);
    const again = new Client(baseUrl);
    expect((await again.signIn(team.emails.changer, 'a new password 1')).signedIn).toBe(true);
  });

  it('a removal from the team ends their sessions; only an admin removes', async () => {
    const leaver = team.clients.leaver;
    expect((await leaver.fetch('/api/designs')).status).toBe(200);
    expect((await leaver.fetch(`/api/team/members/${team.ids.admin}`, { method: 'DELETE' })).status).toBe(403);
    const res = await team.clients.admin.fetch(`/api/team/members/${team.ids.leaver}`, { method: 'DELETE' });
    expect(res.status).toBe(200);
    expect((await leaver.fetch('/api/designs')).status).toBe(401);
    const last = await team.clients.admin.fetch(`/api/team/members/${team.ids.admin}`, { method: 'DELETE' });
    expect(last.status).toBe(422);
  });
});
