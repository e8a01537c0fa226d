/**
 * Malformed input stays answered: generated bodies (10,000 with FUZZ_TOTAL=10000) (wrong types,
 * NaN/Infinity, 1e308, huge arrays, deep nesting, cut-off JSON, wrong content
 * types) against /api/analyze and every write route of the route list →
 * zero 5xx, and every 400/413/415/422 names the field. Counts are printed.
 * Runs on a team of its own, so nothing of the demo team changes.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signedInAs } from '../support/http';
import { ownTeam } from '../support/own-team';
import { concreteUrl, listApiRoutes, WRITE_METHODS } from '../support/route-list';
import { demoInput, type AnalyzeInput } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
// 2,000 in `npm test` (about two minutes on a busy 2-core machine); FUZZ_TOTAL=10000 for the full run.
const TOTAL = Number(process.env.FUZZ_TOTAL ?? 2_000);
const PARALLEL = 8;

let team: Awaited<ReturnType<typeof ownTeam<'admin'>>>;
let input: AnalyzeInput;
let designId = 0;

beforeAll(async () => {
  team = await ownTeam(baseUrl, dbPath, 'fuzz-crew', { admin: 'admin' });
  input = await demoInput(await signedInAs(baseUrl, 'viewer'));
  const created = await team.clients.admin.json('/api/designs', 'POST', { name: 'Fuzz rail', topology: input.converter.topology });
  designId = (await created.json()).id;
  await team.clients.admin.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: null, note: 'r1', input });
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

describe('fuzz', () => {
  it(`${TOTAL} generated bodies: zero 5xx, every 4xx with a body names the field (counts printed)`, { timeout: 900_000 }, async () => {
    const routes = listApiRoutes()
      .filter((x) => !x.pattern.startsWith('/api/auth/'))
      .flatMap((x) => x.methods.filter((m) => WRITE_METHODS.includes(m)).map((method) => ({ method, url: concreteUrl(x.pattern, (p) => (p === 'id' ? designId : 1)) })));
    const targets = [...Array(routes.length).fill({ method: 'POST', url: '/api/analyze?arrays=0' }), ...routes]; // about half to /api/analyze
    const validFor = (url: string): unknown =>
      url.startsWith('/api/analyze') ? input : url.endsWith('/revisions') ? { baseRevision: 1, note: 'n', input } : { name: 'n', topology: 'buck', body: 'b', decision: 'approve', reviewerId: 1 };
    const r = rng(20261202);
    const byStatus = new Map<number, number>();
    const byRoute = new Map<string, number>();
    const unnamed: string[] = [];
    const fivexx: string[] = [];
    let n = 0;
    const started = performance.now();
    const worker = async () => {
      while (n < TOTAL) {
        const i = n++;
        const t = targets[Math.floor(r() * targets.length)];
        const [type, body] = generate(r, validFor(t.url));
        const headers: Record<string, string> = { origin: baseUrl };
        if (type) headers['content-type'] = type;
        let res: Response;
        let text: string;
        try {
          res = await team.clients.admin.fetch(t.url, { method: t.method, headers, body, signal: AbortSignal.timeout(20_000) });
          text = await res.text();
        } catch (err) {
          fivexx.push(`#${i} ${t.method} ${t.url} ${type} ${body.slice(0, 120)} → no answer (${err instanceof Error ? err.name : err})`);
          continue;
        }
        if (i % 1000 === 0) console.log(`[fuzz] ${i} sent, ${((performance.now() - started) / 1000).toFixed(1)} s`);
        byStatus.set(res.status, (byStatus.get(res.status) ?? 0) + 1);
        const key = `${t.method} ${t.url.replace(/\/\d+/g, '/:n')}`;
        byRoute.set(key, (byRoute.get(key) ?? 0) + 1);
        if (res.status >= 500) fivexx.push(`#${i} ${key} ${type} ${body.slice(0, 120)} → ${res.status} ${text.slice(0, 200)}`);
        if ([400, 413, 415, 422].includes(res.status)) {
          let named = false;
          try {
            const parsed = JSON.parse(text) as { error?: string; issues?: { path?: unknown; message?: unknown }[] };
            named = Boolean(parsed.error) && !!parsed.issues?.length && parsed.issues.every((x) => typeof x.path === 'string' && x.path.length > 0 && typeof x.message === 'string');
          } catch {
            named = false;
          }
          if (!named) unnamed.push(`#${i} ${key} ${type} ${body.slice(0, 80)} → ${res.status} ${text.slice(0, 160)}`);
        }
      }
    };
    await Promise.all(Array.from({ length: PARALLEL }, worker));
    const seconds = (performance.now() - started) / 1000;
    console.log(
      `[fuzz] ${TOTAL} bodies in ${seconds.toFixed(1)} s over ${byRoute.size} routes; by status: ${[...byStatus].sort((a, b) => a[0] - b[0]).map(([s, c]) => `${s}×${c}`).join(', ')}; 5xx: ${fivexx.length}; 4xx without a named field: ${unnamed.length}`,
    );
    console.log(`[fuzz] per route: ${[...byRoute].map(([k, c]) => `${k} ${c}`).join('; ')}`);
    expect(fivexx.slice(0, 5)).toEqual([]);
    expect(unnamed.slice(0, 5)).toEqual([]);
  });
});
