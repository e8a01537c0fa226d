import bcrypt from 'bcryptjs';
import { and, asc, eq, sql } from 'drizzle-orm';
import type { Db } from '../connection';
import { memberships, teams, users, type Role } from '../schema';
import { writeAudit } from './audit';

export function normalizeEmail(email: string) {
  return email.trim().toLowerCase();
}

export function hashPassword(password: string) {
  return bcrypt.hashSync(password, 10);
}

export function getUserByEmail(db: Db, email: string) {
  return db.select().from(users).where(eq(users.email, normalizeEmail(email))).get();
}

export function getUserById(db: Db, id: number) {
  return db.select().from(users).where(eq(users.id, id)).get();
}

/** The user when email and password match, else null (same answer for either mistake). */
export function verifyCredentials(db: Db, email: string, password: string) {
  const user = getUserByEmail(db, email);
  if (!user || !bcrypt.compareSync(password, user.passwordHash)) return null;
  return { id: user.id, email: user.email, name: user.name };
}

export function createUser(db: Db, u: { email: string; name: string; password: string }) {
  return db
    .insert(users)
    .values({ email: normalizeEmail(u.email), name: u.name.trim(), passwordHash: hashPassword(u.password) })
    .returning()
    .get();
}

/** A new account from a hash computed elsewhere (off the event loop). */
export function createUserWithHash(db: Db, u: { email: string; name: string; passwordHash: string }) {
  return db.insert(users).values({ email: normalizeEmail(u.email), name: u.name.trim(), passwordHash: u.passwordHash }).returning().get();
}

export function createTeam(db: Db, t: { name: string; slug: string }) {
  return db.insert(teams).values(t).returning().get();
}

/** Teams the user belongs to, with the role in each, oldest membership first. */
export function listTeamsForUser(db: Db, userId: number) {
  return db
    .select({ teamId: teams.id, teamName: teams.name, slug: teams.slug, role: memberships.role })
    .from(memberships)
    .innerJoin(teams, eq(teams.id, memberships.teamId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.id))
    .all();
}

/**
 * The session check's one query: the user and every team they belong to (role, name),
 * oldest membership first; null when the user no longer exists. Indexed by users' primary
 * key and memberships (user_id, team_id).
 */
export function getSessionUser(db: Db, userId: number) {
  const rows = db
    .select({ email: users.email, name: users.name, sessionVersion: users.sessionVersion, teamId: teams.id, teamName: teams.name, role: memberships.role })
    .from(users)
    .leftJoin(memberships, eq(memberships.userId, users.id))
    .leftJoin(teams, eq(teams.id, memberships.teamId))
    .where(eq(users.id, userId))
    .orderBy(asc(memberships.id))
    .all();
  if (rows.length === 0) return null;
  const teamsOf: { teamId: number; teamName: string; role: Role }[] = [];
  for (const r of rows) if (r.teamId !== null && r.teamName !== null && r.role !== null) teamsOf.push({ teamId: r.teamId, teamName: r.teamName, role: r.role });
  return { email: rows[0].email, name: rows[0].name, sessionVersion: rows[0].sessionVersion, teams: teamsOf };
}

export function getMembership(db: Db, userId: number, teamId: number) {
  return db
    .select()
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.teamId, teamId)))
    .get();
}

export function listTeamMembers(db: Db, teamId: number) {
  return db
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.teamId, teamId))
    .orderBy(asc(users.name))
    .all();
}

export class MembershipError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'MembershipError';
  }
}

/** End every session of a user: tokens carrying an older session version are refused (lib/auth.ts). */
export function bumpSessionVersion(db: Db, userId: number) {
  db.update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .run();
}

/** A new password hash (computed by the caller, off the event loop); ends every session of the user. */
export function setPasswordHash(db: Db, userId: number, passwordHash: string) {
  db.transaction((tx) => {
    const txDb: Db = tx;
    txDb.update(users).set({ passwordHash }).where(eq(users.id, userId)).run();
    bumpSessionVersion(txDb, userId);
    writeAudit(txDb, { teamId: null, userId, action: 'user.password-changed', entityType: 'user', entityId: userId, detail: {} });
  });
}

/** Remove a member from a team and end their sessions; the last admin cannot be removed. */
export function removeTeamMember(db: Db, actorId: number, teamId: number, userId: number) {
  return db.transaction((tx) => {
    const txDb: Db = tx;
    const current = getMembership(txDb, userId, teamId);
    if (!current) throw new MembershipError('userId', 'That user is not a member of this team');
    if (current.role === 'admin' && listTeamMembers(txDb, teamId).filter((m) => m.role === 'admin').length <= 1)
      throw new MembershipError('userId', 'A team needs at least one admin');
    txDb.delete(memberships).where(eq(memberships.id, current.id)).run();
    bumpSessionVersion(txDb, userId);
    writeAudit(txDb, { teamId, userId: actorId, action: 'member.removed', entityType: 'user', entityId: userId, detail: { role: current.role } });
  });
}

/** Change a member's role; the last admin of a team cannot be demoted. */
export function setMemberRole(db: Db, actorId: number, teamId: number, userId: number, role: Role) {
  return db.transaction((tx) => {
    const current = getMembership(tx, userId, teamId);
    if (!current) throw new MembershipError('userId', 'That user is not a member of this team');
    if (current.role === 'admin' && role !== 'admin') {
      const admins = listTeamMembers(tx, teamId).filter((m) => m.role === 'admin');
      if (admins.length <= 1) throw new MembershipError('role', 'A team needs at least one admin');
    }
    tx.update(memberships).set({ role }).where(eq(memberships.id, current.id)).run();
    writeAudit(tx, {
      teamId,
      userId: actorId,
      action: 'member.role-changed',
      entityType: 'user',
      entityId: userId,
      detail: { from: current.role, to: role },
    });
  });
}
