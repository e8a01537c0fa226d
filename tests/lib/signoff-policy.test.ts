import { describe, expect, it } from 'vitest';
import { checkDecide, checkSubmit, eligibleReviewers, mayReview } from '@/lib/signoff-policy';

const closed = { adminsMayReview: false };
const open = { adminsMayReview: true };
const AUTHOR = 1;
const SUBMITTER = 2;
const REV_A = 3;
const REV_B = 4;
const ADMIN = 5;
const inReview = (reviewerId: number | null) => ({ state: 'in-review' as const, authorId: AUTHOR, submission: { actorId: SUBMITTER, reviewerId } });

describe('signoff policy', () => {
  it('who may review', () => {
    expect(mayReview('reviewer', closed)).toBe(true);
    expect(mayReview('admin', closed)).toBe(false);
    expect(mayReview('admin', open)).toBe(true);
    expect(mayReview('designer', open)).toBe(false);
    expect(mayReview('viewer', open)).toBe(false);
  });

  it.each([
    ['named reviewer', { id: REV_A, role: 'reviewer' as const }, closed, inReview(REV_A), true],
    ['another reviewer', { id: REV_B, role: 'reviewer' as const }, closed, inReview(REV_A), false],
    ['any reviewer when none named', { id: REV_B, role: 'reviewer' as const }, closed, inReview(null), true],
    ['admin, team closed', { id: ADMIN, role: 'admin' as const }, closed, inReview(null), false],
    ['admin, team open', { id: ADMIN, role: 'admin' as const }, open, inReview(null), true],
    ['the author, even an admin', { id: AUTHOR, role: 'admin' as const }, open, inReview(null), false],
    ['the submitter', { id: SUBMITTER, role: 'admin' as const }, open, inReview(null), false],
    ['a designer', { id: 9, role: 'designer' as const }, open, inReview(null), false],
    ['not in review', { id: REV_A, role: 'reviewer' as const }, closed, { state: 'draft' as const, authorId: AUTHOR, submission: null }, false],
  ])('decide: %s', (_label, actor, team, facts, ok) => {
    expect(checkDecide(actor, team, facts).ok).toBe(ok);
  });

  it('submit: designers and admins, from draft or changes requested, to someone who may review', () => {
    const draft = { state: 'draft' as const, authorId: AUTHOR, submission: null };
    expect(checkSubmit({ id: AUTHOR, role: 'designer' }, closed, draft, { id: REV_A, role: 'reviewer' }).ok).toBe(true);
    expect(checkSubmit({ id: AUTHOR, role: 'designer' }, closed, draft, null).ok).toBe(true);
    expect(checkSubmit({ id: REV_A, role: 'reviewer' }, closed, draft, null)).toMatchObject({ ok: false, status: 403 });
    expect(checkSubmit({ id: AUTHOR, role: 'designer' }, closed, draft, { id: ADMIN, role: 'admin' })).toMatchObject({ ok: false, field: 'reviewerId' });
    expect(checkSubmit({ id: AUTHOR, role: 'designer' }, open, draft, { id: ADMIN, role: 'admin' }).ok).toBe(true);
    expect(checkSubmit({ id: AUTHOR, role: 'designer' }, closed, draft, { id: 77, role: null })).toMatchObject({ ok: false, field: 'reviewerId' });
    expect(checkSubmit({ id: AUTHOR, role: 'designer' }, closed, inReview(null), null)).toMatchObject({ ok: false, field: 'state' });
  });

  it('eligible reviewers leave out the author and the one submitting', () => {
    const members = [
      { userId: AUTHOR, role: 'reviewer' as const },
      { userId: REV_A, role: 'reviewer' as const },
      { userId: ADMIN, role: 'admin' as const },
    ];
    expect(eligibleReviewers(members, closed, SUBMITTER, AUTHOR).map((m) => m.userId)).toEqual([REV_A]);
    expect(eligibleReviewers(members, open, SUBMITTER, AUTHOR).map((m) => m.userId)).toEqual([REV_A, ADMIN]);
  });
});
