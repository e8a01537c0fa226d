/**
 * Personal API tokens: created by the user, shown once, stored hashed;
 * `Authorization: Bearer` acts as that user with that user's role; revoked → 401.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { signedInAs, type Client } from '../support/http';
import { demoInput } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let viewer: Client;
let designer: Client;

beforeAll(async () => {
  viewer = await signedInAs(baseUrl, 'viewer');
  designer = await signedInAs(baseUrl, 'designer');
});

const bearer = (token: string, path: string, init: RequestInit = {}) =>
  fetch(`${baseUrl}${path}`, { ...init, headers: { ...init.headers, authorization: `Bearer ${token}` } });

describe('personal API tokens', () => {
  it('a token acts as its user with their role; revoking ends it', async () => {
    const created = await viewer.json('/api/account/tokens', 'POST', { name: 'script' });
    expect(created.status).toBe(201);
    const { token, id } = await created.json();
    expect(token).toMatch(/^pw_/);
    // stored hashed: the token itself is nowhere in the database
    const db = openDatabase(dbPath);
    const rows = db.$client.prepare('SELECT token_hash, prefix FROM api_tokens WHERE id = ?').all(id) as { token_hash: string; prefix: string }[];
    db.$client.close();
    expect(rows[0].token_hash).not.toContain(token);
    expect(token.startsWith(rows[0].prefix)).toBe(true);
    // listed without the secret
    const list = await (await viewer.fetch('/api/account/tokens')).json();
    expect(JSON.stringify(list)).not.toContain(token);

    const input = await demoInput(viewer);
    const analyze = await bearer(token, '/api/analyze?arrays=0', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(input) });
    expect(analyze.status).toBe(200);
    expect((await analyze.json()).margins).toBeTruthy();
    // the viewer's role holds: no writes
    const write = await bearer(token, '/api/designs', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'By token', topology: 'buck' }) });
    expect(write.status).toBe(403);

    expect((await viewer.fetch(`/api/account/tokens/${id}`, { method: 'DELETE' })).status).toBe(200);
    expect((await bearer(token, '/api/designs')).status).toBe(401);
  });

  it("a designer's token writes as the designer; a made-up token is refused", async () => {
    const { token } = await (await designer.json('/api/account/tokens', 'POST', { name: 'ci' })).json();
    const write = await bearer(token, '/api/designs', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'By token', topology: 'buck' }) });
    expect(write.status).toBe(201);
    expect((await bearer('pw_made-up-token-0000000000000000000000000', '/api/designs')).status).toBe(401);
  });

  it("nobody revokes another user's token", async () => {
    const { id } = await (await designer.json('/api/account/tokens', 'POST', { name: 'mine' })).json();
    expect((await viewer.fetch(`/api/account/tokens/${id}`, { method: 'DELETE' })).status).toBe(404);
  });
});
