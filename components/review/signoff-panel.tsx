'use client';

import Link from 'next/link';
import type { SignoffState } from '@/lib/catalog/signoff';
import { SignoffBadge } from '@/components/designs/signoff-badge';
import { DecisionForm } from './decision-form';
import { RemarkForm } from './remark-form';
import { SignoffTimeline, type TimelineItem } from './signoff-timeline';
import { SubmitForm } from './submit-form';

export type { TimelineItem } from './signoff-timeline';

export interface SignoffPanelProps {
  designId: number;
  number: number;
  state: SignoffState;
  authorName: string;
  timeline: TimelineItem[];
  reviewers: { id: number; name: string; role: string }[];
  /**
   * What the signed-in user may do here, now: the answers of lib/signoff-policy.ts
   * (checkSubmit / checkDecide, state included) computed on the server; the routes ask it again.
   */
  may: { submit: boolean; decide: boolean; remark: boolean };
  /** Why deciding is not offered to a reviewer (they wrote it, submitted it, or it was sent to someone else). */
  decideBlockedReason?: string | null;
  /** Compare with the revision this one was based on, when there is one. */
  compareWith?: number | null;
  /** In review: the reviewer asked, named to everyone but them. */
  waitingFor?: string | null;
}

/**
 * A revision's sign-off: its state, the forms the signed-in member may use now (submit, decide,
 * remark — each its own form and mutation) and the activity so far.
 */
export function SignoffPanel(p: SignoffPanelProps) {
  return (
    <section className="card" aria-labelledby="signoff-heading" data-testid="signoff-panel">
      <header className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-4 py-3">
        <h2 id="signoff-heading" className="font-semibold">
          Sign-off · r{p.number}
        </h2>
        <SignoffBadge state={p.state} />
        <span className="text-xs text-slate-500">written by {p.authorName}</span>
        {p.compareWith && (
          <Link href={`/designs/${p.designId}/compare?a=${p.compareWith}&b=${p.number}`} className="ml-auto text-sm text-indigo-700 hover:underline">
            What changed since r{p.compareWith} →
          </Link>
        )}
      </header>

      <div className="grid gap-6 p-4 lg:grid-cols-[1fr_1fr]">
        <div className="space-y-4">
          {p.may.submit && <SubmitForm designId={p.designId} number={p.number} again={p.state === 'changes-requested'} reviewers={p.reviewers} />}
          {p.decideBlockedReason && <p className="rounded-md bg-slate-50 px-3 py-2 text-sm text-slate-600">{p.decideBlockedReason}</p>}
          {p.may.decide && <DecisionForm designId={p.designId} number={p.number} />}
          {p.state === 'in-review' && !p.may.decide && (
            <p className="rounded-md border-l-2 border-indigo-300 bg-indigo-50 px-3 py-2 text-sm text-indigo-900" data-testid="waiting-for">
              Waiting for {p.waitingFor ?? 'a reviewer of the team'} to approve r{p.number} or request changes.
            </p>
          )}
          {!p.may.submit && !p.may.decide && !p.decideBlockedReason && p.state !== 'in-review' && <p className="text-sm text-slate-500">{idleText(p)}</p>}
        </div>

        <div className="space-y-3">
          <h3 className="text-sm font-semibold">Activity and remarks</h3>
          <SignoffTimeline items={p.timeline} />
          {p.may.remark && <RemarkForm designId={p.designId} number={p.number} />}
        </div>
      </div>
    </section>
  );
}

function idleText(p: SignoffPanelProps) {
  switch (p.state) {
    case 'approved':
      return `r${p.number} is approved. A change means a new revision, which starts as a draft.`;
    case 'changes-requested':
      return 'Changes were requested. Save a new revision from Tune, or submit this one again with an answer.';
    default:
      return p.may.submit ? '' : 'A designer or admin submits this revision when it is ready for review.';
  }
}
