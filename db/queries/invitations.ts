import crypto from 'node:crypto';
import { and, desc, eq, isNull } from 'drizzle-orm';
import type { Db } from '../connection';
import { invitations, memberships, teams, type Role } from '../schema';
import { writeAudit } from './audit';
import { createUserWithHash, getMembership, getUserByEmail, normalizeEmail } from './users';

/**
 * Team invitations. An admin invites an e-mail address with a role; the same
 * happens whether or not the address has an account, so the admin never
 * learns which. The addressee accepts through the mailed link: signed in as
 * that address when an account exists, or by choosing a name and password.
 */
export const INVITATION_DAYS = 7;

export const hashInvitationToken = (token: string) => crypto.createHash('sha256').update(token).digest('hex');

export function createInvitation(db: Db, actorId: number, teamId: number, i: { email: string; role: Role }) {
  const token = crypto.randomBytes(32).toString('base64url');
  const row = db
    .insert(invitations)
    .values({
      teamId,
      email: normalizeEmail(i.email),
      role: i.role,
      tokenHash: hashInvitationToken(token),
      invitedBy: actorId,
      expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
    })
    .returning()
    .get();
  writeAudit(db, { teamId, userId: actorId, action: 'member.invited', entityType: 'invitation', entityId: row.id, detail: { email: row.email, role: i.role } });
  return { invitation: row, token };
}

export function listOpenInvitations(db: Db, teamId: number) {
  return db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt })
    .from(invitations)
    .where(and(eq(invitations.teamId, teamId), isNull(invitations.acceptedAt)))
    .orderBy(desc(invitations.id))
    .all();
}

/** An open, unexpired invitation by its token, with the team's name; null otherwise. */
export function findInvitation(db: Db, token: string) {
  const row = db
    .select({ invitation: invitations, teamName: teams.name })
    .from(invitations)
    .innerJoin(teams, eq(teams.id, invitations.teamId))
    .where(eq(invitations.tokenHash, hashInvitationToken(token)))
    .get();
  if (!row || row.invitation.acceptedAt || row.invitation.expiresAt.getTime() < Date.now()) return null;
  const hasAccount = Boolean(getUserByEmail(db, row.invitation.email));
  return { ...row.invitation, teamName: row.teamName, hasAccount };
}

export class InvitationError extends Error {
  constructor(
    readonly status: 401 | 403 | 404 | 422,
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'InvitationError';
  }
}

/**
 * Accept an invitation. `signedInUserId` must be the invited address's account
 * when one exists; otherwise `newAccount` (name, password hash) creates it.
 */
export function acceptInvitation(
  db: Db,
  token: string,
  a: { signedInUserId: number | null; newAccount?: { name: string; passwordHash: string } },
) {
  return db.transaction(
    (tx) => {
      const txDb: Db = tx;
      const inv = findInvitation(txDb, token);
      if (!inv) throw new InvitationError(404, 'token', 'This invitation is not valid any more; ask the team admin for a new one');
      let user = getUserByEmail(txDb, inv.email);
      if (user) {
        if (a.signedInUserId === null) throw new InvitationError(401, 'email', `Sign in as ${inv.email} to accept this invitation`);
        if (a.signedInUserId !== user.id) throw new InvitationError(403, 'email', `This invitation is for ${inv.email}; sign in with that account`);
      } else {
        if (!a.newAccount) throw new InvitationError(422, 'password', 'Choose a name and a password for your new account');
        user = createUserWithHash(txDb, { email: inv.email, name: a.newAccount.name, passwordHash: a.newAccount.passwordHash });
      }
      if (!getMembership(txDb, user.id, inv.teamId)) txDb.insert(memberships).values({ userId: user.id, teamId: inv.teamId, role: inv.role }).run();
      txDb.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, inv.id)).run();
      writeAudit(txDb, { teamId: inv.teamId, userId: user.id, action: 'member.joined', entityType: 'user', entityId: user.id, detail: { email: inv.email, role: inv.role } });
      return { userId: user.id, teamId: inv.teamId, teamName: inv.teamName, role: inv.role };
    },
    { behavior: 'immediate' },
  );
}
