import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getTeamSignoffSettings, listTeamMembers, submitForReview } from '@/db/queries';
import { eligibleReviewers, maySubmit } from '@/lib/signoff-policy';
import { parseJson, withUser } from '@/lib/api';
import { mailEach, notifyReviewRequested } from '@/lib/notify';
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
    const event = runSignoff(() => submitForReview(db, ref, { actorId: user.id, reviewerId: body.reviewerId, message: body.message }));
    // The reviewer signs off the worst case: the mail states it (a range no circuit can be says so).
    const range = summarizeRange(revision.input);
    const worstCase = range.ok ? worstCaseSentence(range.value) : `Worst case not available: ${range.message}`;
    // The named reviewer, or every member who may review when none is named.
    const team = getTeamSignoffSettings(db, user.teamId);
    const to =
      body.reviewerId != null ? [body.reviewerId] : eligibleReviewers(listTeamMembers(db, user.teamId), team, user.id, revision.authorId).map((u) => u.userId);
    const mailed = await mailEach(db, to, (r) =>
      notifyReviewRequested({
        to: r,
        by: user.name,
        teamId: user.teamId,
        revision: { designId: design.id, designName: design.name, number: ref.number },
        message: body.message,
        worstCase,
      }),
    );
    return NextResponse.json({ state: event.state, event, mailed }, { status: 201 });
  },
  { allow: maySubmit, action: 'submit revisions for review' },
);
