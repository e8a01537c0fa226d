/**
 * List section of `npm run bench`: the designs list's query (listDesignsPage, 100 rows, with the
 * total) on a team of 10, 100 and 10,000 designs, for the default order, a sort by name, a filter
 * and a text filter. The target is flatness: 10,000 designs within 3× the time of 100 (common
 * practice for "flat" on a noisy machine). A team of 100 serves the same full page of 100 rows as
 * the large team; the team of 10 serves 10 rows, so its time (printed) is less work, not a baseline.
 * The text filter reads every row of the team and is shown, not held to it.
 * Also a design's revisions (listRevisionPage, the API's and the pickers' page): 10, 100 and
 * 10,000 revisions, the first (newest) and the last page, held to the same 3×.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { openDatabase } from '@/db/connection';
import { createTeam, createUser, listDesignsPage, listRevisionPage } from '@/db/queries';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { summarizeAnalysis } from '@/lib/revision-summary';
import { designs, memberships, revisions } from '@/db/schema';
import { readDesignListQuery, type DesignListQuery } from '@/lib/designs-list-query';

export interface ListRow {
  name: string;
  smallUs: number;
  /** A team of 100: one full page, as on the large team. */
  pageUs: number;
  largeUs: number;
  held: boolean;
}

function teamOf(size: number) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'phasewright-bench-'));
  const db = openDatabase(path.join(dir, 'bench.db'));
  const team = createTeam(db, { name: 'Bench', slug: 'bench' }).id;
  const owner = createUser(db, { email: 'bench@example.test', name: 'Bench Owner', password: 'long enough' }).id;
  db.insert(memberships).values({ userId: owner, teamId: team, role: 'designer' }).run();
  const topologies = ['buck', 'boost', 'buck-boost'] as const;
  db.transaction((tx) => {
    for (let i = 0; i < size; i++)
      tx.insert(designs)
        .values({ teamId: team, ownerId: owner, name: `Rail ${i}`, description: i % 7 ? '' : 'FPGA core', topology: topologies[i % 3], updatedAt: new Date(1e12 + i * 1000), latestRevision: i % 3 ? 1 : null, signoffState: i % 3 ? 'draft' : null })
        .run();
  });
  return { db, team, cleanup: () => (db.$client.close(), fs.rmSync(dir, { recursive: true, force: true })) };
}

function timeUs(run: () => unknown, n = 200) {
  for (let i = 0; i < 20; i++) run();
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = process.hrtime.bigint();
    run();
    times.push(Number(process.hrtime.bigint() - t0) / 1e3);
  }
  return times.sort((a, b) => a - b)[n >> 1];
}

export function listSection(): ListRow[] {
  const small = teamOf(10);
  const full = teamOf(100);
  const large = teamOf(10_000);
  const cases: { name: string; query: DesignListQuery; held: boolean }[] = [
    { name: 'page 1, newest first', query: readDesignListQuery({}), held: true },
    { name: 'page 1, by name', query: readDesignListQuery({ sort: 'name' }), held: true },
    { name: 'page 1, buck only, by sign-off state', query: readDesignListQuery({ topology: 'buck', sort: 'signoffState' }), held: true },
    { name: 'text filter "fpga"', query: readDesignListQuery({ q: 'fpga' }), held: false },
  ];
  const rows = cases.map((c) => ({
    name: c.name,
    smallUs: timeUs(() => listDesignsPage(small.db, small.team, c.query)),
    pageUs: timeUs(() => listDesignsPage(full.db, full.team, c.query)),
    largeUs: timeUs(() => listDesignsPage(large.db, large.team, c.query)),
    held: c.held,
  }));
  small.cleanup();
  full.cleanup();
  large.cleanup();
  return rows;
}

export function printList(rows: ListRow[]) {
  console.log('\nDesigns list query (listDesignsPage, up to 100 rows and the total): median of 200 calls, a team of 10 / 100 / 10,000 designs');
  for (const r of rows) {
    const ratio = r.largeUs / r.pageUs;
    const verdict = r.held ? `target 10,000 vs 100 ≤ 3×: ${ratio <= 3 ? 'within target' : 'ABOVE target'}` : 'shown, no target (reads every row of the team)';
    console.log(
      `- ${r.name}: ${r.smallUs.toFixed(0)} / ${r.pageUs.toFixed(0)} / ${r.largeUs.toFixed(0)} µs (10,000 vs 100: ${ratio.toFixed(1)}×; vs 10, which serves 10 rows: ${(r.largeUs / r.smallUs).toFixed(1)}×); ${verdict}`,
    );
  }
}

/** A design with `size` revisions (rows written directly, as the seed's copies would be). */
function designWith(size: number) {
  const { db, team, cleanup } = teamOf(1);
  const design = db.select({ id: designs.id, ownerId: designs.ownerId }).from(designs).get()!;
  const input = SAMPLE_DESIGNS[0].request;
  const summary = summarizeAnalysis(analyze(input));
  db.transaction((tx) => {
    for (let n = 1; n <= size; n++)
      tx.insert(revisions)
        .values({ designId: design.id, number: n, baseNumber: n === 1 ? null : n - 1, input, summary, authorId: design.ownerId, note: `r${n}`, createdAt: new Date(1e12 + n * 1000) })
        .run();
  });
  return { db, team, designId: design.id, cleanup };
}

export function revisionsSection(): ListRow[] {
  const sizes = [10, 100, 10_000].map(designWith);
  const [small, full, large] = sizes;
  const lastPage = (d: (typeof sizes)[number]) => listRevisionPage(d.db, d.designId, 1).lastPage;
  const rows = [
    { name: 'page 1 (newest 100)', page: () => 1 },
    { name: 'last page (oldest)', page: lastPage },
  ].map((c) => {
    const time = (d: (typeof sizes)[number]) => {
      const page = c.page(d);
      return timeUs(() => listRevisionPage(d.db, d.designId, page));
    };
    return { name: c.name, smallUs: time(small), pageUs: time(full), largeUs: time(large), held: true };
  });
  for (const d of sizes) d.cleanup();
  return rows;
}

export function printRevisions(rows: ListRow[]) {
  console.log('\nRevisions page (listRevisionPage: up to 100 rows with margins, and the total): median of 200 calls, a design with 10 / 100 / 10,000 revisions');
  for (const r of rows) {
    const ratio = r.largeUs / r.pageUs;
    console.log(
      `- ${r.name}: ${r.smallUs.toFixed(0)} / ${r.pageUs.toFixed(0)} / ${r.largeUs.toFixed(0)} µs (10,000 vs 100: ${ratio.toFixed(1)}×); target ≤ 3×: ${ratio <= 3 ? 'within target' : 'ABOVE target'}`,
    );
  }
}
