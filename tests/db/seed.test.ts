import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { listDesigns, listRevisions, listTeamMembers, listTeamsForUser, getUserByEmail, verifyCredentials } from '@/db/queries';
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '@/db/seed';
import type { Db } from '@/db/connection';
import { tempDb } from '../support/temp-db';

let db: Db;
let cleanup: () => void;
beforeEach(() => ({ db, cleanup } = tempDb()));
afterEach(() => cleanup());

describe('demo seed', () => {
  it('creates four accounts, one per role, that sign in with the demo password', () => {
    seedDemo(db);
    for (const u of DEMO_USERS) expect(verifyCredentials(db, u.email, DEMO_PASSWORD)).not.toBeNull();
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    expect(listTeamMembers(db, teamId).map((m) => m.role).sort()).toEqual(['admin', 'designer', 'reviewer', 'viewer']);
  });

  it('creates a buck, a boost and a buck-boost, each with a first revision with sensible margins', () => {
    seedDemo(db);
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    const designs = listDesigns(db, teamId);
    expect(designs.map((d) => d.topology).sort()).toEqual(['boost', 'buck', 'buck-boost']);
    for (const d of designs) {
      const [r1] = listRevisions(db, d.id);
      expect(r1.number).toBe(1);
      const summary = r1.summary as { margins: { phaseMarginDeg: number } };
      // 45–65° is the usual target window (common practice).
      expect(summary.margins.phaseMarginDeg).toBeGreaterThan(45);
      expect(summary.margins.phaseMarginDeg).toBeLessThan(65);
    }
  });

  it('is idempotent', () => {
    seedDemo(db);
    seedDemo(db);
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    expect(listDesigns(db, teamId)).toHaveLength(3);
    expect(listTeamsForUser(db, getUserByEmail(db, 'viewer@demo.test')!.id)).toHaveLength(1);
    // The designer also reads a second team, with a different role there.
    expect(listTeamsForUser(db, getUserByEmail(db, 'designer@demo.test')!.id).map((t) => t.role)).toEqual(['designer', 'viewer']);
  });
});
