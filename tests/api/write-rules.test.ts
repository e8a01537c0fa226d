/**
 * Cross-site writes and body limits, generated from the route list
 * (app/api/**\/route.ts): every exported write method of every route must
 * refuse a foreign Origin (403), a body that is not JSON/an upload (415) and a
 * body over its limit (413) — each with a sentence. A new route that does not
 * go through lib/api.ts's wrapper fails here without anyone listing it.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signedInAs, type Client } from '../support/http';
import { savedDesign } from '../support/saved-design';
import { concreteUrl, listApiRoutes, WRITE_METHODS } from '../support/route-list';

const baseUrl = inject('baseUrl');
let admin: Client;
let designId: number;

/** Routes that keep their own protection, with the reason. */
const EXEMPT: Record<string, string> = {
  '/api/auth/[...nextauth]': "next-auth's own endpoints: a CSRF token (double-submit cookie) guards their form posts",
};

const writes = listApiRoutes()
  .filter((r) => !(r.pattern in EXEMPT))
  .flatMap((r) => r.methods.filter((m) => WRITE_METHODS.includes(m)).map((method) => ({ method, pattern: r.pattern })));

beforeAll(async () => {
  admin = await signedInAs(baseUrl, 'admin');
  ({ designId } = await savedDesign(admin, 'Write rules rail'));
});

const url = (pattern: string) => concreteUrl(pattern, (p) => (p === 'id' ? designId : 1));

describe('write rules, per route (from app/api/**/route.ts)', () => {
  it('the route list is read (sanity)', () => {
    expect(writes.length).toBeGreaterThan(10);
    expect(writes.map((w) => w.pattern)).toContain('/api/analyze');
  });

  it.each(writes)('$method $pattern: a foreign Origin with the session cookie → 403 with a sentence', async ({ method, pattern }) => {
    for (const origin of ['http://evil.example', baseUrl.replace('127.0.0.1', 'localhost').replace(/:\d+$/, ':1'), 'null']) {
      const res = await admin.fetch(url(pattern), { method, headers: { origin, 'content-type': 'text/plain' }, body: '{"name":"x"}' });
      expect(res.status, `${method} ${pattern} from ${origin}`).toBe(403);
      expect((await res.json()).error).toMatch(/another site/);
    }
    const fetchSite = await admin.fetch(url(pattern), { method, headers: { 'sec-fetch-site': 'same-site', 'content-type': 'application/json' }, body: '{}' });
    expect(fetchSite.status, `${method} ${pattern} with Sec-Fetch-Site: same-site`).toBe(403);
  });

  it.each(writes)('$method $pattern: a form or text/plain body, even same-origin → 415 naming the content type', async ({ method, pattern }) => {
    for (const type of ['application/x-www-form-urlencoded', 'text/html']) {
      const res = await admin.fetch(url(pattern), { method, headers: { origin: baseUrl, 'content-type': type }, body: 'name=x' });
      expect(res.status, `${method} ${pattern} as ${type}`).toBe(415);
      const body = await res.json();
      expect(body.error).toMatch(/Send the/);
      expect(body.issues[0].path).toBe('(content-type)');
    }
  });

  it.each(writes)('$method $pattern: a body over the limit → 413 before parsing', async ({ method, pattern }) => {
    const big = Buffer.alloc(11 * 1024 * 1024, 0x20); // over every route's limit (JSON 256 KB, import 1 MB, bench 10 MB + form)
    const res = await admin.fetch(url(pattern), { method, headers: { origin: baseUrl, 'content-type': 'application/json' }, body: big });
    expect(res.status, `${method} ${pattern}`).toBe(413);
    expect((await res.json()).error).toMatch(/too large/);
  });

  it('same-origin JSON still works (the rules do not block the app itself)', async () => {
    const res = await admin.fetch('/api/designs', { method: 'POST', headers: { origin: baseUrl, 'sec-fetch-site': 'same-origin', 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Same origin', topology: 'buck' }) });
    expect(res.status).toBe(201);
  });
});
