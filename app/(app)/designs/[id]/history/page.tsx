import type { Metadata } from 'next';
import Link from 'next/link';
import {
  getLatestRevision,
  getRevision,
  getSignoffFacts,
  getSignoffState,
  getTeamSignoffSettings,
  listRemarksPage,
  listRevisionPage,
  listSignoffEvents,
  listSignoffStates,
  listTeamMembers,
  revisionPageOf,
} from '@/db/queries';
import { pageParam } from '@/lib/paging';
import { Pager } from '@/components/ui/pager';
import { checkDecide, checkSubmit, eligibleReviewers, mayReview } from '@/lib/signoff-policy';
import { can } from '@/lib/auth';
import { loadDesignPage } from '@/lib/design-page';
import { RevisionTable, type RevisionRow } from '@/components/review/revision-table';
import { SignoffPanel, type TimelineItem } from '@/components/review/signoff-panel';

export const metadata: Metadata = { title: 'History' };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ r?: string; page?: string; remarks?: string }> };

export default async function HistoryPage({ params, searchParams }: Props) {
  const [{ id }, q] = await Promise.all([params, searchParams]);
  const { user, db, design } = await loadDesignPage(id);

  const latest = getLatestRevision(db, design.id);
  if (!latest)
    return (
      <div className="card p-8 text-center text-slate-600">
        No revision saved yet. Shape the loop on{' '}
        <Link href={`/designs/${design.id}`} className="text-indigo-700 underline">
          Tune
        </Link>{' '}
        and save it; every save becomes a revision here.
      </div>
    );

  // 100 revisions a page, newest first; the page is in the URL (?page=), else the one holding ?r=.
  const asked = q.r && /^\d{1,9}$/.test(q.r) ? getRevision(db, design.id, Number(q.r)) : undefined;
  const selected = asked ?? latest;
  const list = listRevisionPage(db, design.id, q.page !== undefined ? pageParam(q.page) : revisionPageOf(latest.number, selected.number));
  const shown = list.revisions.map((x) => x.number);
  const states = listSignoffStates(db, design.id, { from: Math.min(...shown), to: Math.max(...shown) });
  const rows: RevisionRow[] = list.revisions.map((rev) => {
      const margins = rev.margins;
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
    });

  const state = states.get(selected.number) ?? getSignoffState(db, selected.id);
  const remarkPage = listRemarksPage(db, selected.id, pageParam(q.remarks));
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
    ...remarkPage.remarks.map((m) => ({
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
      <div>
        <RevisionTable designId={design.id} rows={rows} selected={selected.number} />
        <Pager
          page={list.page}
          lastPage={list.lastPage}
          total={list.total}
          noun="revisions"
          href={(p) => `/designs/${design.id}/history?page=${p}${asked ? `&r=${selected.number}` : ''}`}
          testId="revisions-pager"
        />
      </div>
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
      <Pager
        page={remarkPage.page}
        lastPage={remarkPage.lastPage}
        total={remarkPage.total}
        noun={`remarks on r${selected.number}`}
        href={(p) => `/designs/${design.id}/history?r=${selected.number}&remarks=${p}`}
        testId="remarks-pager"
      />
    </div>
  );
}
