/**
 * Malformed input stays answered: 10,000 generated bodies (FUZZ_TOTAL) — wrong types,
 * NaN/Infinity, 1e308, huge arrays, deep nesting, cut-off JSON, wrong content types — against
 * /api/analyze and every write route of the route list → zero 5xx, and every 400/413/415/422
 * names the field. Counts are printed.
 *
 * The bulk (all but FUZZ_HTTP, default 1,000) calls the route handlers in this process: the
 * same exported handlers, so the same write rules, streaming body limit, JSON parsing, zod
 * schemas, queries and error mapping, on a migrated database of its own, with the session
 * lookup answered by a stub (the admin of that team) and mail not sent. The HTTP share goes
 * through the built server with a real session, on a team of its own, so nothing of the demo
 * team changes. Both use the same generator and the same checks.
 */
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth';
import { signedInAs } from '../support/http';
import { ownTeam } from '../support/own-team';
import { concreteUrl, listApiRoutes, WRITE_METHODS } from '../support/route-list';
import { demoInput, type AnalyzeInput } from '../support/saved-design';
import { tempDb } from '../support/temp-db';

const stub = vi.hoisted(() => ({ user: null as CurrentUser | null }));
vi.mock('@/lib/auth', async (importOriginal) => ({ ...(await importOriginal<typeof import('@/lib/auth')>()), getCurrentUser: async () => stub.user }));
vi.mock('@/lib/mail', async (importOriginal) => ({ ...(await importOriginal<typeof import('@/lib/mail')>()), sendMail: async () => ({ sent: false }) }));

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const TOTAL = Number(process.env.FUZZ_TOTAL ?? 10_000);
const HTTP_SHARE = Math.min(TOTAL, Number(process.env.FUZZ_HTTP ?? 1_000));
const ROOT = path.resolve(__dirname, '../..');
const LOCAL_ORIGIN = 'http://fuzz.local';

let team: Awaited<ReturnType<typeof ownTeam<'admin'>>>;
let input: AnalyzeInput;
let designId = 0;
let local: { designId: number; cleanup: () => void };

beforeAll(async () => {
  team = await ownTeam(baseUrl, dbPath, 'fuzz-crew', { admin: 'admin' });
  input = await demoInput(await signedInAs(baseUrl, 'viewer'));
  const created = await team.clients.admin.json('/api/designs', 'POST', { name: 'Fuzz rail', topology: input.converter.topology });
  designId = (await created.json()).id;
  await team.clients.admin.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: null, note: 'r1', input });

  // The in-process half: the app's connection is this temporary database (db/client.ts keeps it on globalThis).
  const { db, cleanup } = tempDb();
  globalThis.phasewrightDb = db;
  const { createDesign, createRevision, createTeam, createUser } = await import('@/db/queries');
  const { memberships } = await import('@/db/schema');
  const { sampleRevisionBody } = await import('../support/sample-revision');
  const teamId = createTeam(db, { name: 'Fuzz in process', slug: 'fuzz-local' }).id;
  const admin = createUser(db, { email: 'admin@fuzz.local', name: 'Fuzz admin', password: 'long enough' });
  db.insert(memberships).values({ userId: admin.id, teamId, role: 'admin' }).run();
  const design = createDesign(db, admin.id, teamId, { name: 'Fuzz rail', topology: 'buck' });
  createRevision(db, { teamId, designId: design.id, baseNumber: null, ...sampleRevisionBody(), authorId: admin.id, note: 'r1' });
  stub.user = { id: admin.id, email: 'admin@fuzz.local', name: 'Fuzz admin', teamId, teamName: 'Fuzz in process', role: 'admin', teams: [{ teamId, teamName: 'Fuzz in process', role: 'admin' }] };
  local = { designId: design.id, cleanup };
});

afterAll(() => {
  globalThis.phasewrightDb = undefined;
  local?.cleanup();
});

/** A small seeded generator (mulberry32), so a failure can be replayed. */
function rng(seed: number) {
  return () => {
    seed |= 0;
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const WEIRD: unknown[] = ['NaN', 'Infinity', 1e308, -1e308, 5e-324, -0, '', 'x', null, true, [], {}, [1, 2], { a: 1 }, 2 ** 53 + 1, -1, 0, '1e999', '1e308'];

function leaves(v: unknown, prefix: string[] = [], out: string[][] = []): string[][] {
  if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) leaves(x, [...prefix, k], out);
  else out.push(prefix);
  return out;
}

function setAt(v: unknown, path: string[], value: unknown): unknown {
  if (path.length === 0) return value;
  const copy: Record<string, unknown> = Array.isArray(v) ? ([...v] as unknown as Record<string, unknown>) : { ...(v as Record<string, unknown>) };
  copy[path[0]] = setAt(copy[path[0]], path.slice(1), value);
  return copy;
}

function deep(depth: number) {
  return '['.repeat(depth) + ']'.repeat(depth);
}

/** One generated request body: [content type, raw body]. */
function generate(r: () => number, base: unknown): [string, string] {
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)];
  const kind = r();
  const json = (v: unknown) => ['application/json', JSON.stringify(v)] as [string, string];
  if (kind < 0.45) {
    // one leaf of a valid body turned wrong (or several)
    let v = base;
    const paths = leaves(base);
    for (let i = 0, n = 1 + Math.floor(r() * 3); i < n && paths.length; i++) v = setAt(v, pick(paths), pick(WEIRD));
    const text = JSON.stringify(v).replace(/"(NaN|Infinity|1e999)"/g, (_m, x) => (r() < 0.5 ? x : `"${x}"`));
    return ['application/json', text];
  }
  if (kind < 0.55) return json(setAt(base, [pick(leaves(base)).slice(0, 1)[0] ?? 'x'], Array.from({ length: 5000 + Math.floor(r() * 20000) }, () => r())));
  if (kind < 0.62) return ['application/json', deep(100 + Math.floor(r() * 20000))];
  if (kind < 0.7) return ['application/json', JSON.stringify(base).slice(0, Math.floor(r() * 200))];
  if (kind < 0.78) return json(pick([null, 1, 'text', [], [base], true, 1e308]));
  if (kind < 0.85) return [pick(['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'application/xml', '']), JSON.stringify(base)];
  if (kind < 0.92) return json({ ...(base as object), extra: deep(50), ['__proto__']: { polluted: true } });
  return json(Object.fromEntries(Array.from({ length: 1 + Math.floor(r() * 6) }, () => [pick(['name', 'topology', 'input', 'reviewerId', 'decision', 'body', 'teamId', 'token', 'email', 'role', 'adminsMayReview', 'baseRevision', 'currentPassword', 'newPassword']), pick(WEIRD)])));
}

interface Target {
  method: string;
  url: string;
  file: string;
  params: Record<string, string>;
}

function targetsFor(id: number): Target[] {
  const routes = listApiRoutes()
    .filter((x) => !x.pattern.startsWith('/api/auth/'))
    .flatMap((x) => {
      const params = Object.fromEntries([...x.pattern.matchAll(/\[([^\]]+)\]/g)].map((m) => [m[1], m[1] === 'id' ? String(id) : '1']));
      return x.methods.filter((m) => WRITE_METHODS.includes(m)).map((method) => ({ method, url: concreteUrl(x.pattern, (p) => (p === 'id' ? id : 1)), file: x.file, params }));
    });
  const analyze = routes.find((t) => t.url === '/api/analyze' && t.method === 'POST');
  if (!analyze) throw new Error('POST /api/analyze is missing from the route list');
  return [...Array(routes.length).fill({ ...analyze, url: '/api/analyze?arrays=0' }), ...routes]; // about half to /api/analyze
}

type Send = (t: Target, headers: Record<string, string>, body: string) => Promise<{ status: number; text: string }>;

interface Tally {
  byStatus: Map<number, number>;
  byRoute: Map<string, number>;
  unnamed: string[];
  fivexx: string[];
  seconds: number;
}

/** `count` generated bodies through `send`, `parallel` at a time; what came back, tallied. */
async function fuzz(count: number, seed: number, parallel: number, targets: Target[], origin: string, send: Send): Promise<Tally> {
  const validFor = (url: string): unknown =>
    url.startsWith('/api/analyze') ? input : url.endsWith('/revisions') ? { baseRevision: 1, note: 'n', input } : { name: 'n', topology: 'buck', body: 'b', decision: 'approve', reviewerId: 1 };
  const r = rng(seed);
  const tally: Tally = { byStatus: new Map(), byRoute: new Map(), unnamed: [], fivexx: [], seconds: 0 };
  let n = 0;
  const started = performance.now();
  const worker = async () => {
    while (n < count) {
      const i = n++;
      const t = targets[Math.floor(r() * targets.length)];
      const [type, body] = generate(r, validFor(t.url));
      const headers: Record<string, string> = { origin };
      if (type) headers['content-type'] = type;
      const key = `${t.method} ${t.url.replace(/\/\d+/g, '/:n')}`;
      let res: { status: number; text: string };
      try {
        res = await send(t, headers, body);
      } catch (err) {
        tally.fivexx.push(`#${i} ${key} ${type} ${body.slice(0, 120)} → no answer (${err instanceof Error ? `${err.name}: ${err.message}` : err})`);
        continue;
      }
      tally.byStatus.set(res.status, (tally.byStatus.get(res.status) ?? 0) + 1);
      tally.byRoute.set(key, (tally.byRoute.get(key) ?? 0) + 1);
      if (res.status >= 500) tally.fivexx.push(`#${i} ${key} ${type} ${body.slice(0, 120)} → ${res.status} ${res.text.slice(0, 200)}`);
      if ([400, 413, 415, 422].includes(res.status)) {
        let named = false;
        try {
          const parsed = JSON.parse(res.text) as { error?: string; issues?: { path?: unknown; message?: unknown }[] };
          named = Boolean(parsed.error) && !!parsed.issues?.length && parsed.issues.every((x) => typeof x.path === 'string' && x.path.length > 0 && typeof x.message === 'string');
        } catch {
          named = false;
        }
        if (!named) tally.unnamed.push(`#${i} ${key} ${type} ${body.slice(0, 80)} → ${res.status} ${res.text.slice(0, 160)}`);
      }
    }
  };
  await Promise.all(Array.from({ length: parallel }, worker));
  tally.seconds = (performance.now() - started) / 1000;
  return tally;
}

const statuses = (t: Tally) => [...t.byStatus].sort((a, b) => a[0] - b[0]).map(([s, c]) => `${s}×${c}`).join(', ');

describe('fuzz', () => {
  it(`${TOTAL} generated bodies (${TOTAL - HTTP_SHARE} to the handlers in process, ${HTTP_SHARE} over HTTP): zero 5xx, every 4xx with a body names the field (counts printed)`, { timeout: 900_000 }, async () => {
    const handlers = new Map<string, (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>>();
    const inProcess: Send = async (t, headers, body) => {
      const k = `${t.method} ${t.file}`;
      if (!handlers.has(k)) handlers.set(k, (await import(path.join(ROOT, t.file)))[t.method]);
      const res = await handlers.get(k)!(new Request(new URL(t.url, LOCAL_ORIGIN), { method: t.method, headers, body }), { params: Promise.resolve(t.params) });
      return { status: res.status, text: await res.text() };
    };
    // A fetch that fails before any answer (seen once in CI at 16 in parallel, most likely a
    // kept-alive socket closed under it) is sent once more and counted; failing twice is a failure.
    let resent = 0;
    const overHttp: Send = async (t, headers, body) => {
      const once = async () => {
        const res = await team.clients.admin.fetch(t.url, { method: t.method, headers, body, signal: AbortSignal.timeout(20_000) });
        return { status: res.status, text: await res.text() };
      };
      try {
        return await once();
      } catch (err) {
        if (!(err instanceof TypeError)) throw err;
        resent++;
        return await once();
      }
    };
    const local_ = await fuzz(TOTAL - HTTP_SHARE, 20261202, 4, targetsFor(local.designId), LOCAL_ORIGIN, inProcess);
    console.log(`[fuzz] in process: ${TOTAL - HTTP_SHARE} bodies in ${local_.seconds.toFixed(1)} s over ${local_.byRoute.size} routes; by status: ${statuses(local_)}; 5xx: ${local_.fivexx.length}; 4xx without a named field: ${local_.unnamed.length}`);
    const http = await fuzz(HTTP_SHARE, 20261203, 16, targetsFor(designId), baseUrl, overHttp);
    console.log(`[fuzz] over HTTP: ${HTTP_SHARE} bodies in ${http.seconds.toFixed(1)} s over ${http.byRoute.size} routes; by status: ${statuses(http)}; 5xx: ${http.fivexx.length}; 4xx without a named field: ${http.unnamed.length}; sent again after a closed socket: ${resent}`);
    const perRoute = new Map(local_.byRoute);
    for (const [k, c] of http.byRoute) perRoute.set(k, (perRoute.get(k) ?? 0) + c);
    console.log(`[fuzz] ${TOTAL} bodies in all; per route: ${[...perRoute].map(([k, c]) => `${k} ${c}`).join('; ')}`);
    expect(local_.fivexx.slice(0, 5)).toEqual([]);
    expect(local_.unnamed.slice(0, 5)).toEqual([]);
    expect(http.fivexx.slice(0, 5)).toEqual([]);
    expect(http.unnamed.slice(0, 5)).toEqual([]);
  });
});
