import type { Metadata } from 'next';
import Link from 'next/link';
import { getSignoffFacts, getTeamSignoffSettings, listRemarks, listRevisions, listSignoffEvents, listSignoffStates, listTeamMembers } from '@/db/queries';
import { checkDecide, checkSubmit, eligibleReviewers, mayReview } from '@/lib/signoff-policy';
import { can } from '@/lib/auth';
import { loadDesignPage } from '@/lib/design-page';
import { RevisionTable, type RevisionRow } from '@/components/review/revision-table';
import { SignoffPanel, type TimelineItem } from '@/components/review/signoff-panel';

export const metadata: Metadata = { title: 'History' };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ r?: string }> };

export default async function HistoryPage({ params, searchParams }: Props) {
  const [{ id }, { r }] = await Promise.all([params, searchParams]);
  const { user, db, design } = await loadDesignPage(id);

  const revisions = listRevisions(db, design.id);
  if (revisions.length === 0)
    return (
      <div className="card p-8 text-center text-slate-600">
        No revision saved yet. Shape the loop on{' '}
        <Link href={`/designs/${design.id}`} className="text-indigo-700 underline">
          Tune
        </Link>{' '}
        and save it; every save becomes a revision here.
      </div>
    );

  const states = listSignoffStates(db, design.id);
  const rows: RevisionRow[] = revisions
    .map((rev) => {
      const margins = rev.summary.margins;
      return {
        number: rev.number,
        baseNumber: rev.baseNumber,
        authorName: rev.authorName,
        createdAt: rev.createdAt.toISOString(),
        note: rev.note,
        crossoverHz: margins?.crossoverHz ?? null,
        phaseMarginDeg: margins?.phaseMarginDeg ?? null,
        gainMarginDb: margins?.gainMarginDb ?? null,
        state: states.get(rev.number) ?? 'draft',
      };
    })
    .reverse();

  const latest = revisions[revisions.length - 1];
  const selected = revisions.find((x) => String(x.number) === r) ?? latest;
  const state = states.get(selected.number) ?? 'draft';
  const events = listSignoffEvents(db, selected.id);
  const waitingFor = state === 'in-review' ? (events.findLast((e) => e.state === 'in-review')?.reviewerName ?? null) : null;
  const timeline: TimelineItem[] = [
    ...events.map((e) => ({
      kind: 'event' as const,
      id: e.id,
      at: e.createdAt.toISOString(),
      who: e.actorName,
      state: e.state,
      reviewerName: e.state === 'in-review' ? e.reviewerName : null,
      text: e.message,
    })),
    ...listRemarks(db, selected.id).map((m) => ({
      kind: 'remark' as const,
      id: m.id,
      at: m.createdAt.toISOString(),
      who: m.authorName,
      text: m.comparedWith ? `(on Compare with r${m.comparedWith}) ${m.body}` : m.body,
    })),
  ].sort((x, y) => x.at.localeCompare(y.at));

  // Who may do what is the sign-off policy's answer (lib/signoff-policy.ts); the routes ask it again.
  const team = getTeamSignoffSettings(db, user.teamId);
  const facts = getSignoffFacts(db, selected.id);
  const actor = { id: user.id, role: user.role };
  const reviewers = eligibleReviewers(listTeamMembers(db, user.teamId), team, user.id, selected.authorId)
    .map((m) => ({ id: m.userId, name: m.name, role: m.role }))
    .sort((a, b) => (a.role === b.role ? a.name.localeCompare(b.name) : a.role === 'reviewer' ? -1 : 1));
  const submit = checkSubmit(actor, team, facts, null);
  const decide = checkDecide(actor, team, facts);
  // A reviewer who may not decide here is told why (author, submitter, sent to someone else).
  const decideBlockedReason = !decide.ok && state === 'in-review' && mayReview(user.role, team) ? decide.reason : null;

  return (
    <div className="space-y-4">
      <RevisionTable designId={design.id} rows={rows} selected={selected.number} />
      <SignoffPanel
        key={selected.number}
        designId={design.id}
        number={selected.number}
        state={state}
        authorName={selected.authorName}
        timeline={timeline}
        reviewers={reviewers}
        may={{ submit: submit.ok, decide: decide.ok, remark: can.remark(user.role) }}
        waitingFor={waitingFor}
        compareWith={selected.baseNumber ?? (selected.number > 1 ? selected.number - 1 : null)}
        decideBlockedReason={decideBlockedReason}
      />
    </div>
  );
}
