import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getUserById, listTeamMembers, submitForReview } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseJson, withUser } from '@/lib/api';
import { notifyReviewRequested } from '@/lib/notify';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { summarizeRange, worstCaseSentence } from '@/lib/range-summary';
import { requireRevision, runSignoff } from '@/lib/revision-access';
import { submitForReviewSchema } from '@/lib/validation/signoff';

type P = { id: string; number: string };

/** Submit a revision for review to a reviewer of the team; the reviewer gets a mail. */
export const POST = withUser<P>(
  async (req, { user, params }) => {
    const { design, revision, ref } = requireRevision(user, params);
    const body = await parseJson(req, submitForReviewSchema);
    const db = getDb();
    const reviewers = new Set(listTeamMembers(db, user.teamId).filter((m) => can.review(m.role)).map((m) => m.userId));
    const event = runSignoff(() =>
      submitForReview(db, ref, { actorId: user.id, reviewerId: body.reviewerId, message: body.message, isReviewer: (id) => reviewers.has(id) }),
    );
    const reviewer = getUserById(db, body.reviewerId)!;
    // The reviewer signs off the worst case: the mail states it (a range no circuit can be says so).
    const range = summarizeRange(revision.input as AnalyzeRequest);
    const mail = await notifyReviewRequested({
      to: { email: reviewer.email, name: reviewer.name },
      by: user.name,
      revision: { designId: design.id, designName: design.name, number: ref.number },
      message: body.message,
      worstCase: range.ok ? worstCaseSentence(range.value) : `Worst case not available: ${range.message}`,
    });
    return NextResponse.json({ state: event.state, event, mailed: mail.sent }, { status: 201 });
  },
  { allow: can.editDesigns, action: 'submit revisions for review' },
);
