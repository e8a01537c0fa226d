/**
 * Load section of `npm run bench`: autocannon against the production build (the tests' build,
 * .next-test, rebuilt when stale) on 127.0.0.1, on a throw-away database seeded with the demo
 * team plus 5,000 designs. Each route runs 10 s at 10 and at 50 connections; the ratios to
 * GET /api/auth/csrf (the framework's lightest route) are what the targets name, since this
 * machine's absolute numbers swing with its load.
 */
import autocannon from 'autocannon';
import Database from 'better-sqlite3';
import { buildIfStale, startApp } from '../../tests/support/app-server';
import { signedInAs } from '../../tests/support/http';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';

export const SEEDED_DESIGNS = 5000;

interface LoadCase {
  name: string;
  method: 'GET' | 'POST';
  path: string;
  body?: string;
  signedIn: boolean;
  /** Least req/s as a fraction of the baseline's at the same connections. */
  targetRatio?: number;
}

export interface LoadRow {
  name: string;
  connections: number;
  reqPerSec: number;
  p50Ms: number;
  p99Ms: number;
  errors: number;
  ratio: number | null;
  targetRatio?: number;
}

/** 5,000 designs in the demo team, a third with a saved revision (list columns set as the triggers would). */
function seedDesigns(dbPath: string, count: number) {
  const db = new Database(dbPath);
  const team = db.prepare(`SELECT id FROM teams ORDER BY id LIMIT 1`).get() as { id: number };
  const owner = db.prepare(`SELECT user_id AS id FROM memberships WHERE team_id = ? AND role = 'designer' LIMIT 1`).get(team.id) as { id: number };
  const insert = db.prepare(
    `INSERT INTO designs (team_id, owner_id, name, description, topology, created_at, updated_at, latest_revision, signoff_state)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const topologies = ['buck', 'boost', 'buck-boost'];
  const states = ['draft', 'in-review', 'approved', 'changes-requested'];
  const t0 = Date.now() - count * 60_000;
  db.transaction(() => {
    for (let i = 0; i < count; i++) {
      const saved = i % 3 !== 0;
      insert.run(team.id, owner.id, `Load rail ${i}`, i % 7 === 0 ? 'point-of-load converter for the FPGA core' : '', topologies[i % 3], t0 + i * 60_000, t0 + i * 60_000, saved ? 1 + (i % 9) : null, saved ? states[i % 4] : null);
    }
  })();
  db.close();
}

const run = (url: string, c: LoadCase, connections: number, headers: Record<string, string>, seconds: number) =>
  autocannon({
    url: url + c.path,
    method: c.method,
    body: c.body,
    headers: { 'accept-encoding': 'gzip', ...(c.body ? { 'content-type': 'application/json' } : {}), ...headers },
    connections,
    duration: seconds,
  });

export async function loadSection(opts: { seconds?: number; connections?: number[] } = {}): Promise<LoadRow[]> {
  const seconds = opts.seconds ?? 10;
  const connectionSets = opts.connections ?? [10, 50];
  const t = Date.now();
  buildIfStale();
  const app = await startApp();
  const rows: LoadRow[] = [];
  try {
    seedDesigns(app.dbPath, SEEDED_DESIGNS);
    const viewer = await signedInAs(app.baseUrl, 'viewer');
    const cookie = viewer.cookieHeader();
    const sample = SAMPLE_DESIGNS.find((s) => s.request.converter.topology === 'boost') ?? SAMPLE_DESIGNS[0];
    const body = JSON.stringify(sample.request);
    const cases: LoadCase[] = [
      { name: 'GET /api/auth/csrf (baseline)', method: 'GET', path: '/api/auth/csrf', signedIn: false },
      { name: 'POST /api/analyze?arrays=0 (no arrays)', method: 'POST', path: '/api/analyze?arrays=0', body, signedIn: true, targetRatio: 0.5 },
      { name: 'POST /api/analyze (400-point arrays)', method: 'POST', path: '/api/analyze', body, signedIn: true, targetRatio: 0.3 },
      { name: `GET /api/designs (${SEEDED_DESIGNS.toLocaleString('en')} designs, page 1)`, method: 'GET', path: '/api/designs', signedIn: true, targetRatio: 0.5 },
    ];
    // A first call of each warms the route (compiled on first use), outside the timing.
    for (const c of cases) {
      const res = await fetch(app.baseUrl + c.path, { method: c.method, body: c.body, headers: { 'content-type': 'application/json', origin: app.baseUrl, ...(c.signedIn ? { cookie } : {}) } });
      if (!res.ok) throw new Error(`${c.name} answered ${res.status} before the load run`);
      await res.arrayBuffer();
    }
    for (const connections of connectionSets) {
      let baseline = 0;
      for (const c of cases) {
        const r = await run(app.baseUrl, c, connections, { origin: app.baseUrl, ...(c.signedIn ? { cookie } : {}) }, seconds);
        const reqPerSec = r.requests.average;
        if (!c.targetRatio) baseline = reqPerSec;
        rows.push({
          name: c.name,
          connections,
          reqPerSec,
          p50Ms: r.latency.p50,
          p99Ms: r.latency.p99,
          errors: r.errors + r.timeouts + r.non2xx,
          ratio: c.targetRatio ? reqPerSec / baseline : null,
          targetRatio: c.targetRatio,
        });
      }
    }
  } finally {
    await app.stop();
  }
  console.log(`  (load section took ${((Date.now() - t) / 1000).toFixed(0)} s)`);
  return rows;
}

export function printLoad(rows: LoadRow[]) {
  console.log('\nLoad: autocannon, production build on 127.0.0.1, 10 s per row (req/s is the mean; ratio = req/s ÷ the baseline at the same connections)');
  for (const r of rows) {
    const verdict =
      r.ratio === null ? 'baseline' : `ratio ${r.ratio.toFixed(2)} (target ≥ ${r.targetRatio}): ${r.ratio >= (r.targetRatio ?? 0) ? 'within target' : 'BELOW target'}`;
    console.log(
      `- ${r.name}, ${r.connections} connections\n    ${r.reqPerSec.toFixed(0)} req/s, p50 ${r.p50Ms} ms, p99 ${r.p99Ms} ms${r.errors ? `, ${r.errors} errors/non-2xx` : ''}; ${verdict}`,
    );
  }
}
