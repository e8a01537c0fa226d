/**
 * The migration that gave bench data a revision: data uploaded before goes to the design's
 * latest revision at migration time; a design without a revision keeps it design-wide (null).
 * And the trigger that keeps signed-off work: a design with an approved revision is never deleted.
 */
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readMigrationFiles } from 'drizzle-orm/migrator';

const MIGRATIONS = path.resolve(import.meta.dirname, '../../db/migrations');

function migratedUpTo(tag: string) {
  // Copy the migrations up to `tag` into a folder of their own, journal included.
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pw-mig-'));
  const journal = JSON.parse(fs.readFileSync(path.join(MIGRATIONS, 'meta/_journal.json'), 'utf8'));
  const upto = journal.entries.findIndex((e: { tag: string }) => e.tag === tag);
  fs.mkdirSync(path.join(dir, 'meta'));
  fs.writeFileSync(path.join(dir, 'meta/_journal.json'), JSON.stringify({ ...journal, entries: journal.entries.slice(0, upto + 1) }));
  for (const e of journal.entries.slice(0, upto + 1)) fs.copyFileSync(path.join(MIGRATIONS, `${e.tag}.sql`), path.join(dir, `${e.tag}.sql`));
  return dir;
}

describe('bench data → revision migration', () => {
  it('assigns old bench data to the latest revision, leaves a design without revisions design-wide', () => {
    const sqlite = new Database(':memory:');
    sqlite.pragma('foreign_keys = ON');
    const db = drizzle(sqlite);
    const journal = JSON.parse(fs.readFileSync(path.join(MIGRATIONS, 'meta/_journal.json'), 'utf8'));
    const tags: string[] = journal.entries.map((e: { tag: string }) => e.tag);
    const before = tags[tags.findIndex((t) => t.includes('bench_backfill_delete_guard')) - 1];
    migrate(db, { migrationsFolder: migratedUpTo(before) });
    sqlite.exec(`INSERT INTO users (id, email, name, password_hash) VALUES (1, 'a@x', 'A', 'h');
      INSERT INTO teams (id, name, slug) VALUES (1, 'T', 't');
      INSERT INTO designs (id, team_id, name, topology, owner_id) VALUES (1, 1, 'with revisions', 'buck', 1), (2, 1, 'none saved', 'buck', 1);
      INSERT INTO revisions (id, design_id, number, input, summary, author_id) VALUES (10, 1, 1, '{}', '{}', 1), (11, 1, 2, '{}', '{}', 1);
      INSERT INTO bench_data (id, design_id, name, points, uploaded_by) VALUES (100, 1, 'old', '{}', 1), (101, 2, 'orphan', '{}', 1);`);
    migrate(db, { migrationsFolder: MIGRATIONS });
    const rows = sqlite.prepare('SELECT id, revision_id AS revisionId FROM bench_data ORDER BY id').all();
    expect(rows).toEqual([
      { id: 100, revisionId: 11 },
      { id: 101, revisionId: null },
    ]);
    expect(readMigrationFiles({ migrationsFolder: MIGRATIONS }).length).toBe(tags.length);
  });

  it('refuses to delete a design with an approved revision, even in plain SQL', () => {
    const sqlite = new Database(':memory:');
    sqlite.pragma('foreign_keys = ON');
    migrate(drizzle(sqlite), { migrationsFolder: MIGRATIONS });
    sqlite.exec(`INSERT INTO users (id, email, name, password_hash) VALUES (1, 'a@x', 'A', 'h'), (2, 'b@x', 'B', 'h');
      INSERT INTO teams (id, name, slug) VALUES (1, 'T', 't');
      INSERT INTO designs (id, team_id, name, topology, owner_id) VALUES (1, 1, 'approved', 'buck', 1), (2, 1, 'draft', 'buck', 1);
      INSERT INTO revisions (id, design_id, number, input, summary, author_id) VALUES (10, 1, 1, '{}', '{}', 1), (20, 2, 1, '{}', '{}', 1);
      INSERT INTO signoff_events (revision_id, state, actor_id, reviewer_id) VALUES (10, 'in-review', 1, 2), (10, 'approved', 2, NULL);`);
    expect(() => sqlite.prepare('DELETE FROM designs WHERE id = 1').run()).toThrow(/approved revision cannot be deleted/);
    sqlite.prepare('DELETE FROM designs WHERE id = 2').run();
    expect(sqlite.prepare('SELECT id FROM designs').all()).toEqual([{ id: 1 }]);
  });
});
