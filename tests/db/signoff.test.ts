import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  addRemark,
  createDesign,
  createRevision,
  createTeam,
  decideSignoff,
  getSignoffState,
  listAudit,
  listDesigns,
  listRemarks,
  listSignoffEvents,
  listSignoffStates,
  SignoffForbiddenError,
  setTeamSignoffSettings,
  SignoffRuleError,
  submitForReview,
} from '@/db/queries';
import type { Db } from '@/db/connection';
import { memberships } from '@/db/schema';
import { tempDb } from '../support/temp-db';
import { createTestUser } from '../support/users';
import { sampleRevisionBody } from '../support/sample-revision';

let db: Db;
let cleanup: () => void;
let team: number;
const u = { designer: 0, reviewer: 0, admin: 0, reviewer2: 0 };
let ref: { teamId: number; designId: number; revisionId: number; number: number };

beforeEach(() => {
  ({ db, cleanup } = tempDb());
  team = createTeam(db, { name: 'T', slug: 't' }).id;
  for (const role of ['designer', 'reviewer', 'admin'] as const) {
    u[role] = createTestUser(db, { email: `${role}@example.test`, name: role, password: 'long enough' }).id;
    db.insert(memberships).values({ userId: u[role], teamId: team, role }).run();
  }
  u.reviewer2 = createTestUser(db, { email: 'reviewer2@example.test', name: 'reviewer2', password: 'long enough' }).id;
  db.insert(memberships).values({ userId: u.reviewer2, teamId: team, role: 'reviewer' }).run();
  const design = createDesign(db, u.designer, team, { name: 'D', topology: 'buck' });
  const rev = createRevision(db, { teamId: team, designId: design.id, baseNumber: null, ...sampleRevisionBody(), authorId: u.designer, note: '' });
  ref = { teamId: team, designId: design.id, revisionId: rev.id, number: rev.number };
});
afterEach(() => cleanup());

const submit = (actorId = u.designer, reviewerId: number | null = u.reviewer, message = 'please look') =>
  submitForReview(db, ref, { actorId, reviewerId, message });

function forbidden(fn: () => unknown): SignoffForbiddenError {
  try {
    fn();
  } catch (err) {
    if (err instanceof SignoffForbiddenError) return err;
    throw err;
  }
  throw new Error('expected a SignoffForbiddenError');
}

function ruleError(fn: () => unknown): SignoffRuleError {
  try {
    fn();
  } catch (err) {
    if (err instanceof SignoffRuleError) return err;
    throw err;
  }
  throw new Error('expected a SignoffRuleError');
}

describe('sign-off', () => {
  it('a new revision is a draft; the designs list shows the latest state', () => {
    expect(getSignoffState(db, ref.revisionId)).toBe('draft');
    expect(listDesigns(db, team)[0].signoffState).toBe('draft');
    submit();
    expect(getSignoffState(db, ref.revisionId)).toBe('in-review');
    expect(listDesigns(db, team)[0].signoffState).toBe('in-review');
    expect(listSignoffStates(db, ref.designId).get(1)).toBe('in-review');
  });

  it('draft → in-review → changes-requested → in-review → approved, each event audited', () => {
    submit();
    const first = decideSignoff(db, ref, { actorId: u.reviewer, decision: 'request-changes', message: 'raise PM' });
    expect(first.event.state).toBe('changes-requested');
    expect(first.notifyUserIds).toEqual([u.designer]);
    submit(u.admin, u.reviewer, 'fixed');
    const second = decideSignoff(db, ref, { actorId: u.reviewer, decision: 'approve', message: '' });
    expect(second.event.state).toBe('approved');
    // author (designer) and the one who submitted this time (admin) hear of it
    expect(second.notifyUserIds.sort()).toEqual([u.designer, u.admin].sort());
    const events = listSignoffEvents(db, ref.revisionId);
    expect(events.map((e) => e.state)).toEqual(['in-review', 'changes-requested', 'in-review', 'approved']);
    expect(events[0]).toMatchObject({ actorName: 'designer', reviewerName: 'reviewer', message: 'please look' });
    const actions = listAudit(db, team).map((a) => a.action);
    expect(actions.filter((a) => a.startsWith('signoff.'))).toHaveLength(4);
  });

  it('refuses moves the state does not allow', () => {
    expect(ruleError(() => decideSignoff(db, ref, { actorId: u.reviewer, decision: 'approve', message: '' })).field).toBe('state');
    submit();
    expect(ruleError(() => submit()).field).toBe('state');
    decideSignoff(db, ref, { actorId: u.reviewer, decision: 'approve', message: '' });
    expect(ruleError(() => submit()).field).toBe('state');
    expect(ruleError(() => decideSignoff(db, ref, { actorId: u.reviewer, decision: 'request-changes', message: 'x' })).field).toBe('state');
  });

  it('nobody signs off their own revision', () => {
    submit(u.admin, u.reviewer);
    expect(() => decideSignoff(db, ref, { actorId: u.designer, decision: 'approve', message: '' })).toThrow(SignoffForbiddenError);
    expect(getSignoffState(db, ref.revisionId)).toBe('in-review');
  });

  it('only the named reviewer decides; another reviewer is refused', () => {
    submit(u.designer, u.reviewer);
    expect(forbidden(() => decideSignoff(db, ref, { actorId: u.reviewer2, decision: 'approve', message: '' })).message).toMatch(/another reviewer/);
    expect(decideSignoff(db, ref, { actorId: u.reviewer, decision: 'approve', message: '' }).event.state).toBe('approved');
  });

  it('naming nobody lets any reviewer of the team decide', () => {
    submit(u.designer, null);
    expect(decideSignoff(db, ref, { actorId: u.reviewer2, decision: 'approve', message: '' }).event.state).toBe('approved');
  });

  it('an admin reviews only when the team allows it, and never decides what they submitted', () => {
    expect(ruleError(() => submit(u.designer, u.admin)).field).toBe('reviewerId');
    submit(u.designer, null);
    expect(forbidden(() => decideSignoff(db, ref, { actorId: u.admin, decision: 'approve', message: '' })).message).toMatch(/does not let admins/);
    setTeamSignoffSettings(db, u.admin, team, { adminsMayReview: true });
    expect(decideSignoff(db, ref, { actorId: u.admin, decision: 'request-changes', message: 'fix it' }).event.state).toBe('changes-requested');
    // the admin submits it again themselves: they may not decide it now
    submit(u.admin, null);
    expect(forbidden(() => decideSignoff(db, ref, { actorId: u.admin, decision: 'approve', message: '' })).message).toMatch(/submitted/);
  });

  it('a reviewer or viewer may not submit', () => {
    expect(forbidden(() => submit(u.reviewer, u.reviewer2)).message).toMatch(/may not submit/);
  });

  it('checks the reviewer: one who may review, not the author, not the one asking', () => {
    expect(ruleError(() => submit(u.designer, u.designer)).field).toBe('reviewerId');
    setTeamSignoffSettings(db, u.admin, team, { adminsMayReview: true });
    expect(ruleError(() => submit(u.admin, u.admin)).field).toBe('reviewerId');
    expect(ruleError(() => submit(u.designer, 9999)).field).toBe('reviewerId');
    expect(getSignoffState(db, ref.revisionId)).toBe('draft');
  });

  it('asks for a message when requesting changes', () => {
    submit();
    expect(ruleError(() => decideSignoff(db, ref, { actorId: u.reviewer, decision: 'request-changes', message: '  ' })).field).toBe('message');
  });
});

describe('remarks', () => {
  it('attach to a revision in order, audited', () => {
    addRemark(db, { ...ref, authorId: u.reviewer, body: 'Why E24 here?' });
    addRemark(db, { ...ref, authorId: u.designer, body: 'Stock on hand' });
    expect(listRemarks(db, ref.revisionId).map((r) => [r.authorName, r.body])).toEqual([
      ['reviewer', 'Why E24 here?'],
      ['designer', 'Stock on hand'],
    ]);
    expect(listAudit(db, team).filter((a) => a.action === 'remark.added')).toHaveLength(2);
  });
});
