import { alias } from 'drizzle-orm/sqlite-core';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { Db } from '../connection';
import {
  checkDecide,
  checkDecisionMessage,
  checkSubmit,
  type PolicyRefusal,
  type SignoffFacts,
  type TeamSignoffSettings,
} from '../../lib/signoff-policy';
import { memberships, revisions, signoffEvents, teams, users, type Role, type SignoffState } from '../schema';
import { writeAudit } from './audit';

/**
 * Sign-off of a revision: an append-only list of events, the latest giving
 * the state (no event = draft). Allowed moves:
 *   draft / changes-requested → in-review   (submit, naming a reviewer or nobody)
 *   in-review → approved / changes-requested (decision; who may: lib/signoff-policy.ts)
 */
export { SUBMITTABLE_FROM } from '../../lib/signoff-policy';

/** A sign-off move the current state does not allow, or a reviewer who may not review; maps to 422. */
export class SignoffRuleError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'SignoffRuleError';
  }
}

/** The acting user may not take this step on this revision (e.g. approve their own); maps to 403. */
export class SignoffForbiddenError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SignoffForbiddenError';
  }
}

export type Decision = 'approve' | 'request-changes';

const DECISION_STATE: Record<Decision, SignoffState> = {
  approve: 'approved',
  'request-changes': 'changes-requested',
};

/** The state of one revision: its latest event's, else draft. */
export function getSignoffState(db: Db, revisionId: number): SignoffState {
  const row = db
    .select({ state: signoffEvents.state })
    .from(signoffEvents)
    .where(eq(signoffEvents.revisionId, revisionId))
    .orderBy(desc(signoffEvents.id))
    .limit(1)
    .get();
  return row?.state ?? 'draft';
}

/** State of every revision of a design, keyed by revision number. */
export function listSignoffStates(db: Db, designId: number, numbers?: { from: number; to: number }): Map<number, SignoffState> {
  const range = numbers ? sql` AND r.number BETWEEN ${numbers.from} AND ${numbers.to}` : sql``;
  const rows = db.all<{ number: number; state: SignoffState | null }>(
    sql`SELECT r.number AS number,
               (SELECT e.state FROM signoff_events e WHERE e.revision_id = r.id ORDER BY e.id DESC LIMIT 1) AS state
          FROM revisions r WHERE r.design_id = ${designId}${range}`,
  );
  return new Map(rows.map((r) => [r.number, r.state ?? 'draft']));
}

const actor = alias(users, 'actor');
const reviewer = alias(users, 'reviewer');

/** Sign-off events of a revision, oldest first, with the names of actor and reviewer. */
export function listSignoffEvents(db: Db, revisionId: number) {
  return db
    .select({
      id: signoffEvents.id,
      state: signoffEvents.state,
      actorId: signoffEvents.actorId,
      actorName: actor.name,
      reviewerId: signoffEvents.reviewerId,
      reviewerName: reviewer.name,
      message: signoffEvents.message,
      createdAt: signoffEvents.createdAt,
    })
    .from(signoffEvents)
    .innerJoin(actor, eq(actor.id, signoffEvents.actorId))
    .leftJoin(reviewer, eq(reviewer.id, signoffEvents.reviewerId))
    .where(eq(signoffEvents.revisionId, revisionId))
    .orderBy(asc(signoffEvents.id))
    .all();
}

export type SignoffEventView = ReturnType<typeof listSignoffEvents>[number];

/** The latest submission (in-review event) of a revision: who asked, and whom. */
function latestSubmission(db: Db, revisionId: number) {
  return db
    .select({ reviewerId: signoffEvents.reviewerId, actorId: signoffEvents.actorId })
    .from(signoffEvents)
    .where(and(eq(signoffEvents.revisionId, revisionId), eq(signoffEvents.state, 'in-review')))
    .orderBy(desc(signoffEvents.id))
    .limit(1)
    .get();
}

interface RevisionRef {
  teamId: number;
  designId: number;
  revisionId: number;
  number: number;
}

function revisionAuthor(db: Db, revisionId: number) {
  return db.select({ authorId: revisions.authorId }).from(revisions).where(eq(revisions.id, revisionId)).get()?.authorId;
}

function insertEvent(
  db: Db,
  ref: RevisionRef,
  e: { state: SignoffState; actorId: number; reviewerId?: number | null; message: string; from: SignoffState },
) {
  const row = db
    .insert(signoffEvents)
    .values({ revisionId: ref.revisionId, state: e.state, actorId: e.actorId, reviewerId: e.reviewerId ?? null, message: e.message })
    .returning()
    .get();
  writeAudit(db, {
    teamId: ref.teamId,
    userId: e.actorId,
    action: `signoff.${e.state}`,
    entityType: 'revision',
    entityId: ref.revisionId,
    detail: { designId: ref.designId, number: ref.number, from: e.from, to: e.state, reviewerId: e.reviewerId ?? null },
  });
  return row;
}

function policyError(a: PolicyRefusal): Error {
  return a.status === 403 ? new SignoffForbiddenError(a.reason) : new SignoffRuleError(a.field, a.reason);
}

/** The team's sign-off settings (admins reviewing or not). */
export function getTeamSignoffSettings(db: Db, teamId: number): TeamSignoffSettings {
  const row = db.select({ adminsMayReview: teams.adminsMayReview }).from(teams).where(eq(teams.id, teamId)).get();
  return { adminsMayReview: row?.adminsMayReview ?? false };
}

export function setTeamSignoffSettings(db: Db, actorId: number, teamId: number, s: TeamSignoffSettings) {
  db.update(teams).set({ adminsMayReview: s.adminsMayReview }).where(eq(teams.id, teamId)).run();
  writeAudit(db, { teamId, userId: actorId, action: 'team.signoff-settings', entityType: 'team', entityId: teamId, detail: { ...s } });
}

function roleIn(db: Db, userId: number, teamId: number): Role | null {
  return (
    db
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.userId, userId), eq(memberships.teamId, teamId)))
      .get()?.role ?? null
  );
}

/** What the sign-off policy looks at for one revision: state, author, latest submission. */
export function getSignoffFacts(db: Db, revisionId: number): SignoffFacts {
  return {
    state: getSignoffState(db, revisionId),
    authorId: revisionAuthor(db, revisionId) ?? 0,
    submission: latestSubmission(db, revisionId) ?? null,
  };
}

/**
 * Submit a revision for review, naming a reviewer or nobody (then any
 * reviewer of the team decides). The rules are lib/signoff-policy.ts's,
 * checked here inside the write transaction.
 */
export function submitForReview(db: Db, ref: RevisionRef, s: { actorId: number; reviewerId: number | null; message: string }) {
  return db.transaction(
    (tx) => {
      const facts = getSignoffFacts(tx, ref.revisionId);
      const team = getTeamSignoffSettings(tx, ref.teamId);
      const actorRole = roleIn(tx, s.actorId, ref.teamId);
      if (!actorRole) throw new SignoffForbiddenError('You are not a member of this team');
      const reviewer = s.reviewerId == null ? null : { id: s.reviewerId, role: roleIn(tx, s.reviewerId, ref.teamId) };
      const answer = checkSubmit({ id: s.actorId, role: actorRole }, team, facts, reviewer);
      if (!answer.ok) throw policyError(answer);
      return insertEvent(tx, ref, { state: 'in-review', actorId: s.actorId, reviewerId: s.reviewerId, message: s.message, from: facts.state });
    },
    { behavior: 'immediate' },
  );
}

/**
 * Approve or request changes on a revision in review, by the named reviewer
 * (or any team reviewer when none was named); never its author or whoever
 * submitted it (lib/signoff-policy.ts). Returns the event plus who to tell:
 * the author and whoever submitted it.
 */
export function decideSignoff(db: Db, ref: RevisionRef, d: { actorId: number; decision: Decision; message: string }) {
  return db.transaction(
    (tx) => {
      const facts = getSignoffFacts(tx, ref.revisionId);
      const team = getTeamSignoffSettings(tx, ref.teamId);
      const actorRole = roleIn(tx, d.actorId, ref.teamId);
      if (!actorRole) throw new SignoffForbiddenError('You are not a member of this team');
      const answer = checkDecide({ id: d.actorId, role: actorRole }, team, facts);
      if (!answer.ok) throw policyError(answer);
      const msg = checkDecisionMessage(d.decision, d.message);
      if (!msg.ok) throw policyError(msg);
      const submitterId = facts.submission?.actorId ?? null;
      const event = insertEvent(tx, ref, { state: DECISION_STATE[d.decision], actorId: d.actorId, message: d.message, from: facts.state });
      const notify = [...new Set([facts.authorId, submitterId].filter((x): x is number => x != null && x !== 0 && x !== d.actorId))];
      return { event, notifyUserIds: notify };
    },
    { behavior: 'immediate' },
  );
}
