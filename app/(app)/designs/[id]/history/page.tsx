import type { Metadata } from 'next';
import Link from 'next/link';
import { listRemarks, listRevisions, listSignoffEvents, listSignoffStates, listTeamMembers } from '@/db/queries';
import { can } from '@/lib/auth';
import { loadDesignPage } from '@/lib/design-page';
import type { RevisionSummary } from '@/lib/revision-summary';
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
      const margins = (rev.summary as RevisionSummary).margins;
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

  const reviewers = listTeamMembers(db, user.teamId)
    .filter((m) => can.review(m.role) && m.userId !== selected.authorId && m.userId !== user.id)
    .map((m) => ({ id: m.userId, name: m.name, role: m.role }))
    .sort((a, b) => (a.role === b.role ? a.name.localeCompare(b.name) : a.role === 'reviewer' ? -1 : 1));
  const isAuthor = selected.authorId === user.id;

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
        may={{ submit: can.editDesigns(user.role), decide: can.review(user.role), remark: can.remark(user.role) }}
        waitingFor={waitingFor}
        compareWith={selected.baseNumber ?? (selected.number > 1 ? selected.number - 1 : null)}
        decideBlockedReason={isAuthor ? `You wrote r${selected.number}, so someone else must approve it or request changes.` : null}
      />
    </div>
  );
}
