import { alias } from 'drizzle-orm/sqlite-core';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { Db } from '../connection';
import { revisions, signoffEvents, users, type SignoffState } from '../schema';
import { writeAudit } from './audit';

/**
 * Sign-off of a revision: an append-only list of events, the latest giving
 * the state (no event = draft). Allowed moves:
 *   draft / changes-requested → in-review   (submit, naming a reviewer)
 *   in-review → approved / changes-requested (decision by someone other than the author)
 */

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

export const SUBMITTABLE_FROM: readonly SignoffState[] = ['draft', 'changes-requested'];

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
export function listSignoffStates(db: Db, designId: number): Map<number, SignoffState> {
  const rows = db.all<{ number: number; state: SignoffState | null }>(
    sql`SELECT r.number AS number,
               (SELECT e.state FROM signoff_events e WHERE e.revision_id = r.id ORDER BY e.id DESC LIMIT 1) AS state
          FROM revisions r WHERE r.design_id = ${designId}`,
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

/**
 * Ask a reviewer to sign off a revision. The reviewer must be a team member
 * who may review (checked by the caller's `isReviewer`), and neither the
 * revision's author nor the one asking.
 */
export function submitForReview(
  db: Db,
  ref: RevisionRef,
  s: { actorId: number; reviewerId: number; message: string; isReviewer: (userId: number) => boolean },
) {
  return db.transaction(
    (tx) => {
      const from = getSignoffState(tx, ref.revisionId);
      if (!SUBMITTABLE_FROM.includes(from))
        throw new SignoffRuleError('state', `r${ref.number} is ${from}; only a draft or a revision with changes requested can be submitted`);
      if (!s.isReviewer(s.reviewerId))
        throw new SignoffRuleError('reviewerId', 'Choose a reviewer or admin of this team');
      if (s.reviewerId === revisionAuthor(tx, ref.revisionId))
        throw new SignoffRuleError('reviewerId', `The reviewer cannot be the author of r${ref.number}`);
      if (s.reviewerId === s.actorId) throw new SignoffRuleError('reviewerId', 'Ask someone other than yourself');
      return insertEvent(tx, ref, { state: 'in-review', actorId: s.actorId, reviewerId: s.reviewerId, message: s.message, from });
    },
    { behavior: 'immediate' },
  );
}

/**
 * Approve or request changes on a revision in review. Nobody decides on a
 * revision they wrote. A request for changes must say what to change.
 * Returns the event plus who to tell: the author and whoever submitted it.
 */
export function decideSignoff(db: Db, ref: RevisionRef, d: { actorId: number; decision: Decision; message: string }) {
  return db.transaction(
    (tx) => {
      const from = getSignoffState(tx, ref.revisionId);
      const authorId = revisionAuthor(tx, ref.revisionId);
      if (authorId === d.actorId) throw new SignoffForbiddenError(`You wrote r${ref.number}; someone else must sign it off`);
      if (from !== 'in-review')
        throw new SignoffRuleError('state', `r${ref.number} is ${from}; only a revision in review can be approved or sent back`);
      if (d.decision === 'request-changes' && !d.message.trim())
        throw new SignoffRuleError('message', 'Say what should change');
      const submitterId = latestSubmission(tx, ref.revisionId)?.actorId ?? null;
      const event = insertEvent(tx, ref, { state: DECISION_STATE[d.decision], actorId: d.actorId, message: d.message, from });
      const notify = [...new Set([authorId, submitterId].filter((x): x is number => x != null && x !== d.actorId))];
      return { event, notifyUserIds: notify };
    },
    { behavior: 'immediate' },
  );
}
