import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  countDesignsWaitingFor,
  getSignoffState,
  listBenchData,
  listDesigns,
  listMail,
  listMailTo,
  listRemarks,
  listRevisions,
  listTeamMembers,
  listTeamsForUser,
  getUserByEmail,
  verifyCredentials,
} from '@/db/queries';
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '@/db/seed';
import { DEMO_STORIES, DEMO_WAITING } from '@/db/seed-story';
import type { Db } from '@/db/connection';
import { summarizeRange } from '@/lib/range-summary';
import { tempDb } from '../support/temp-db';

// One seeded database for the file: the tests only read it, and seeding it again is the idempotency check.
let db: Db;
let cleanup: () => void;
beforeAll(() => {
  ({ db, cleanup } = tempDb());
  seedDemo(db);
}, 60_000);
afterAll(() => cleanup());

describe('demo seed', () => {
  it('creates four accounts, one per role, that sign in with the demo password', () => {
    for (const u of DEMO_USERS) expect(verifyCredentials(db, u.email, DEMO_PASSWORD)).not.toBeNull();
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    expect(listTeamMembers(db, teamId).map((m) => m.role).sort()).toEqual(['admin', 'designer', 'reviewer', 'viewer']);
  });

  it('creates a buck, a boost and a buck-boost, each with a first revision with sensible margins', () => {
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    const designs = listDesigns(db, teamId).filter((d) => !DEMO_STORIES.some((s) => s.name === d.name));
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
    const mailCount = listMail(db, 1000).length;
    seedDemo(db);
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    expect(listDesigns(db, teamId)).toHaveLength(3 + DEMO_STORIES.length);
    expect(listMail(db, 1000)).toHaveLength(mailCount);
    expect(listRevisions(db, listDesigns(db, teamId).find((d) => d.name === DEMO_WAITING.name)!.id)).toHaveLength(2);
    expect(listTeamsForUser(db, getUserByEmail(db, 'viewer@demo.test')!.id)).toHaveLength(1);
    // The designer also reads a second team, with a different role there.
    expect(listTeamsForUser(db, getUserByEmail(db, 'designer@demo.test')!.id).map((t) => t.role)).toEqual(['designer', 'viewer']);
  });
});

describe('demo review story', () => {
  it('takes a design through three revisions: thin margin sent back with remarks, sent back again, approved with bench data', () => {
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    const story = listDesigns(db, teamId).find((d) => d.name === DEMO_STORIES[0].name)!;
    const revs = listRevisions(db, story.id);
    expect(revs.map((r) => r.number)).toEqual([1, 2, 3]);
    const pm = (r: (typeof revs)[number]) => (r.summary as { margins: { phaseMarginDeg: number } }).margins.phaseMarginDeg;
    expect(pm(revs[0])).toBeLessThan(40); // the thin first try
    expect(pm(revs[2])).toBeGreaterThan(50);
    expect(revs.map((r) => getSignoffState(db, r.id))).toEqual(['changes-requested', 'changes-requested', 'approved']);
    expect(listRemarks(db, revs[0].id).length).toBeGreaterThanOrEqual(2);
    expect(listRemarks(db, revs[1].id)[0].comparedWith).toBe(1);
    expect(listBenchData(db, teamId, story.id, { revisionNumber: 3 }).map((b) => b.revisionNumber)).toEqual([3]);
    expect(listBenchData(db, teamId, story.id, { revisionNumber: 1 }).map((b) => b.revisionNumber)).toEqual([1]);
    // The approved revision holds across its stored operating range, not only at nominal.
    const worst = summarizeRange(revs[2].input);
    expect(worst.ok && worst.value.worst.phaseMarginDeg.value).toBeGreaterThan(45);
    expect(worst.ok && worst.value.spread.meetsTargets.share).toBeGreaterThan(0.95);
  });

  it('stores the mail each step sends: requests to the reviewer, decisions and remarks to the designer', () => {
    const name = DEMO_STORIES[0].name;
    const toReviewer = listMailTo(db, 'reviewer@demo.test', 100).map((m) => m.subject);
    const toDesigner = listMailTo(db, 'designer@demo.test', 100).map((m) => m.subject);
    expect(toReviewer).toEqual(expect.arrayContaining([`Review requested: ${name} r1`, `Review requested: ${name} r3`, `Review requested: ${DEMO_WAITING.name} r2`, `Remark on ${name} r1`]));
    expect(toDesigner).toEqual(expect.arrayContaining([`Changes requested: ${name} r1`, `Changes requested: ${name} r2`, `Approved: ${name} r3`, `Remark on ${name} r2`]));
    expect(listMailTo(db, 'designer@demo.test', 100).every((m) => m.teamId !== null)).toBe(true);
    // Review requests state the worst case across the operating range, as the submit route's do.
    for (const m of listMailTo(db, 'reviewer@demo.test', 100).filter((m) => m.subject.startsWith('Review requested'))) expect(m.text).toMatch(/Worst case over 32 corners/);
  });

  it('holds a current-mode design with its operating range: r1 sent back for a corner at subharmonic risk, r2 clear and approved', () => {
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    const story = DEMO_STORIES.find((s) => typeof s.sample !== 'string' && s.sample.modulator.mode === 'peak-current')!;
    const design = listDesigns(db, teamId).find((d) => d.name === story.name)!;
    const revs = listRevisions(db, design.id);
    expect(revs).toHaveLength(2);
    for (const r of revs) {
      expect(r.input.modulator).toMatchObject({ mode: 'peak-current' });
      expect(r.input.compensator.amplifier).toBe('transconductance');
      expect('range' in r.input && 'step' in r.input).toBe(true);
    }
    const [s1, s2] = revs.map((r) => summarizeRange(r.input));
    expect(s1.ok && s1.value.risks?.map((x) => x.id)).toContain('subharmonic');
    expect(s2.ok && s2.value.risks).toEqual([]);
    expect(s2.ok && s2.value.worst.phaseMarginDeg.value).toBeGreaterThan(45);
    expect(revs.map((r) => getSignoffState(db, r.id))).toEqual(['changes-requested', 'approved']);
    expect(listBenchData(db, teamId, design.id, { revisionNumber: 2 })).toHaveLength(1);
  });

  it('leaves one design waiting for the demo reviewer', () => {
    const teamId = listTeamsForUser(db, getUserByEmail(db, 'admin@demo.test')!.id)[0].teamId;
    const reviewer = getUserByEmail(db, 'reviewer@demo.test')!;
    expect(countDesignsWaitingFor(db, teamId, reviewer.id)).toBe(1);
    expect(listDesigns(db, teamId, { waitingForUserId: reviewer.id }).map((d) => d.name)).toEqual([DEMO_WAITING.name]);
  });
});
