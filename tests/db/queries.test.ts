import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  createDesign,
  createRevision,
  createTeam,
  createUser,
  getDesign,
  listAudit,
  listDesigns,
  listRevisions,
  listTeamMembers,
  listTeamsForUser,
  MembershipError,
  RevisionConflictError,
  setMemberRole,
  verifyCredentials,
} from '@/db/queries';
import { memberships } from '@/db/schema';
import { resolveDatabasePath, type OpenDb } from '@/db/connection';
import { createTestUser } from '../support/users';
import { tempDb } from '../support/temp-db';
import { sampleRevisionBody } from '../support/sample-revision';

let db: OpenDb;
let cleanup: () => void;
let teamA: number;
let teamB: number;
let alice: number;
let bob: number;

beforeEach(() => {
  ({ db, cleanup } = tempDb());
  teamA = createTeam(db, { name: 'A', slug: 'a' }).id;
  teamB = createTeam(db, { name: 'B', slug: 'b' }).id;
  alice = createTestUser(db, { email: 'Alice@Example.test', name: 'Alice', password: 'correct horse' }).id;
  bob = createTestUser(db, { email: 'bob@example.test', name: 'Bob', password: 'battery staple' }).id;
  db.insert(memberships).values({ userId: alice, teamId: teamA, role: 'admin' }).run();
  db.insert(memberships).values({ userId: bob, teamId: teamB, role: 'designer' }).run();
});
afterEach(() => cleanup());

describe('connection', () => {
  it('turns on WAL and foreign keys', () => {
    expect(db.$client.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(db.$client.pragma('foreign_keys', { simple: true })).toBe(1);
  });

  it('reads DATABASE_URL as a path or a file: URL', () => {
    expect(resolveDatabasePath('file:data/x.db')).toMatch(/data\/x\.db$/);
    expect(resolveDatabasePath('file:///tmp/y.db')).toBe('/tmp/y.db');
    expect(resolveDatabasePath('/tmp/z.db')).toBe('/tmp/z.db');
    expect(resolveDatabasePath(undefined)).toMatch(/data\/phasewright\.db$/);
  });
});

describe('users', () => {
  it('verifies credentials with a bcrypt hash, email case-insensitive', () => {
    expect(verifyCredentials(db, 'alice@example.test', 'correct horse')?.id).toBe(alice);
    expect(verifyCredentials(db, 'ALICE@example.test', 'correct horse')?.id).toBe(alice);
    expect(verifyCredentials(db, 'alice@example.test', 'wrong')).toBeNull();
    expect(verifyCredentials(db, 'nobody@example.test', 'correct horse')).toBeNull();
    // createUser hashes the password itself (the fixtures above share a hash).
    const carol = createUser(db, { email: ' Carol@Example.test ', name: 'Carol', password: 'tulip wire' });
    expect(carol.passwordHash).toMatch(/^\$2[aby]\$10\$/);
    expect(verifyCredentials(db, 'carol@example.test', 'tulip wire')?.id).toBe(carol.id);
  });

  it('lists only the teams a user belongs to', () => {
    expect(listTeamsForUser(db, alice).map((t) => t.teamId)).toEqual([teamA]);
  });

  it('keeps at least one admin', () => {
    expect(() => setMemberRole(db, alice, teamA, alice, 'viewer')).toThrow(/at least one admin/);
    db.insert(memberships).values({ userId: bob, teamId: teamA, role: 'viewer' }).run();
    setMemberRole(db, alice, teamA, bob, 'reviewer');
    expect(listTeamMembers(db, teamA).find((m) => m.userId === bob)?.role).toBe('reviewer');
  });
});

describe('designs', () => {
  it('are scoped to their team', () => {
    const d = createDesign(db, alice, teamA, { name: 'Rail', topology: 'buck' });
    expect(getDesign(db, teamA, d.id)?.name).toBe('Rail');
    expect(getDesign(db, teamB, d.id)).toBeUndefined();
    expect(listDesigns(db, teamB)).toEqual([]);
    expect(listDesigns(db, teamA)[0]).toMatchObject({ name: 'Rail', latestRevision: null, signoffState: null });
  });
});

describe('revisions', () => {
  const save = (designId: number, baseNumber: number | null, note = '') =>
    createRevision(db, { teamId: teamA, designId, baseNumber, ...sampleRevisionBody(), authorId: alice, note });

  it('number 1, 2, … and show as draft in the list', () => {
    const d = createDesign(db, alice, teamA, { name: 'Rail', topology: 'buck' });
    expect(save(d.id, null).number).toBe(1);
    expect(save(d.id, 1).number).toBe(2);
    expect(listRevisions(db, d.id).map((r) => r.number)).toEqual([1, 2]);
    expect(listDesigns(db, teamA)[0]).toMatchObject({ latestRevision: 2, signoffState: 'draft' });
  });

  it('refuse a save from a stale base with the latest number', () => {
    const d = createDesign(db, alice, teamA, { name: 'Rail', topology: 'buck' });
    save(d.id, null);
    save(d.id, 1);
    try {
      save(d.id, 1);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(RevisionConflictError);
      expect((e as RevisionConflictError).latestRevision).toBe(2);
    }
    expect(listRevisions(db, d.id)).toHaveLength(2);
  });

  it('are immutable in the database itself', () => {
    const d = createDesign(db, alice, teamA, { name: 'Rail', topology: 'buck' });
    save(d.id, null);
    expect(() => db.$client.prepare("UPDATE revisions SET note = 'changed'").run()).toThrow(/immutable/);
    expect(() => db.$client.prepare("UPDATE audit_log SET action = 'x'").run()).toThrow(/append-only/);
  });
});
