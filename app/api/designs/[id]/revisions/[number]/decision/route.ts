import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { decideSignoff } from '@/db/queries';
import { parseJson, withUser } from '@/lib/api';
import { mailEach, notifyDecision } from '@/lib/notify';
import { mayEverReview } from '@/lib/signoff-policy';
import { requireRevision, runSignoff } from '@/lib/revision-access';
import { decisionSchema } from '@/lib/validation/signoff';

type P = { id: string; number: string };

/**
 * Approve or request changes on a revision in review; its author (and submitter) get a mail.
 * Who may decide is lib/signoff-policy.ts's rule, checked in decideSignoff (403 / 422).
 */
export const POST = withUser<P>(
  async (req, { user, params }) => {
    const { design, ref } = requireRevision(user, params);
    const body = await parseJson(req, decisionSchema);
    const db = getDb();
    const { event, notifyUserIds } = runSignoff(() => decideSignoff(db, ref, { actorId: user.id, decision: body.decision, message: body.message }));
    const revision = { designId: design.id, designName: design.name, number: ref.number };
    const mailed = await mailEach(db, notifyUserIds, (to) =>
      notifyDecision({ to, by: user.name, teamId: user.teamId, revision, decision: body.decision, message: body.message }),
    );
    return NextResponse.json({ state: event.state, event, mailed }, { status: 201 });
  },
  { allow: mayEverReview, action: 'approve or request changes' },
);
