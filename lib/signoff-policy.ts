/**
 * The sign-off policy: who may submit a revision for review, who may review,
 * and who may decide (approve or request changes), in which state. One pure
 * module used by the database queries (which enforce it inside the
 * transaction), the route handlers, the pages and the client panels, so the
 * rule is written once. No server imports: client components import it too.
 *
 * The rules:
 * - Submit: a designer or admin of the team, from draft or changes-requested.
 *   A named reviewer must be able to review, and be neither the author nor the
 *   one submitting. Naming nobody leaves the decision to any reviewer of the team.
 * - Review (be named, decide): a member with the reviewer role; an admin only
 *   when the team allows admins to review (`adminsMayReview`).
 * - Decide: only in review; never the author; never whoever submitted it;
 *   when a reviewer was named, only that reviewer; otherwise any member who may
 *   review. Asking for changes needs a message saying what to change.
 */
import type { Role, SignoffState } from '@/db/schema';

export const SUBMITTABLE_FROM: readonly SignoffState[] = ['draft', 'changes-requested'];

export interface TeamSignoffSettings {
  /** Whether admins of the team may review and decide, as reviewers do. */
  adminsMayReview: boolean;
}

export interface SignoffActor {
  id: number;
  role: Role;
}

/** The facts about one revision the rules look at. */
export interface SignoffFacts {
  state: SignoffState;
  authorId: number;
  /** The latest submission (in-review event), when there is one. */
  submission: { actorId: number; reviewerId: number | null } | null;
}

/** A refusal: `status` 403 for "not you", 422 for "not now / not like this"; `field` names what to fix. */
export interface PolicyRefusal {
  ok: false;
  status: 403 | 422;
  field: string;
  reason: string;
}
export type PolicyAnswer = { ok: true } | PolicyRefusal;

const OK: PolicyAnswer = { ok: true };
const refuse = (status: 403 | 422, field: string, reason: string): PolicyRefusal => ({ ok: false, status, field, reason });

/** Whether a member with this role may review and decide in this team. */
export function mayReview(role: Role, team: TeamSignoffSettings): boolean {
  return role === 'reviewer' || (role === 'admin' && team.adminsMayReview);
}

/** Whether some team could let this role decide (reviewers; admins when allowed): the route's first gate, before the revision is looked up. */
export function mayEverReview(role: Role): boolean {
  return role === 'reviewer' || role === 'admin';
}

/** Whether a member with this role may submit revisions for review at all. */
export function maySubmit(role: Role): boolean {
  return role === 'designer' || role === 'admin';
}

/**
 * May `actor` submit this revision now, naming `reviewer` (or nobody)?
 * `reviewer` is the named member's id and role in this team (null role: not a member).
 */
export function checkSubmit(
  actor: SignoffActor,
  team: TeamSignoffSettings,
  facts: SignoffFacts,
  reviewer: { id: number; role: Role | null } | null,
): PolicyAnswer {
  if (!maySubmit(actor.role)) return refuse(403, 'role', `Your role (${actor.role}) may not submit revisions for review`);
  if (!SUBMITTABLE_FROM.includes(facts.state))
    return refuse(422, 'state', `This revision is ${facts.state}; only a draft or a revision with changes requested can be submitted`);
  if (reviewer) {
    if (!reviewer.role || !mayReview(reviewer.role, team))
      return refuse(422, 'reviewerId', team.adminsMayReview ? 'Choose a reviewer or admin of this team' : 'Choose a reviewer of this team');
    if (reviewer.id === facts.authorId) return refuse(422, 'reviewerId', 'The reviewer cannot be the author of the revision');
    if (reviewer.id === actor.id) return refuse(422, 'reviewerId', 'Ask someone other than yourself');
  }
  return OK;
}

/** May `actor` approve or send back this revision now? */
export function checkDecide(actor: SignoffActor, team: TeamSignoffSettings, facts: SignoffFacts): PolicyAnswer {
  if (!mayReview(actor.role, team))
    return refuse(
      403,
      'role',
      actor.role === 'admin'
        ? 'This team does not let admins review; a reviewer decides'
        : `Your role (${actor.role}) may not approve or request changes`,
    );
  if (facts.authorId === actor.id) return refuse(403, 'actor', 'You wrote this revision; someone else must sign it off');
  if (facts.state !== 'in-review')
    return refuse(422, 'state', `This revision is ${facts.state}; only a revision in review can be approved or sent back`);
  if (facts.submission?.actorId === actor.id)
    return refuse(403, 'actor', 'You submitted this revision for review; the reviewer decides');
  const named = facts.submission?.reviewerId ?? null;
  if (named !== null && named !== actor.id) return refuse(403, 'actor', 'This revision was sent to another reviewer; only they decide');
  return OK;
}

/** A decision's own rule: asking for changes must say what to change. */
export function checkDecisionMessage(decision: 'approve' | 'request-changes', message: string): PolicyAnswer {
  if (decision === 'request-changes' && !message.trim()) return refuse(422, 'message', 'Say what should change');
  return OK;
}

/** Members who may be named as reviewer when `actor` submits this revision. */
export function eligibleReviewers<M extends { userId: number; role: Role }>(
  members: readonly M[],
  team: TeamSignoffSettings,
  actorId: number,
  authorId: number,
): M[] {
  return members.filter((m) => mayReview(m.role, team) && m.userId !== actorId && m.userId !== authorId);
}
