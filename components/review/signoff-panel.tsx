'use client';

import type { SignoffState } from '@/lib/catalog/signoff';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { SignoffBadge } from '@/components/designs/signoff-badge';
import { formatDate } from './format';
import { answerMessage, postJson } from './post-json';

export interface TimelineItem {
  kind: 'event' | 'remark';
  id: number;
  at: string;
  who: string;
  state?: string;
  reviewerName?: string | null;
  text: string;
}

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

const EVENT_WORDS: Record<string, string> = {
  'in-review': 'submitted for review',
  approved: 'approved',
  'changes-requested': 'requested changes',
};

export function SignoffPanel(p: SignoffPanelProps) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<{ field: string; message: string } | null>(null);
  // '' = nobody named: any reviewer of the team may decide.
  const [reviewerId, setReviewerId] = useState<number | ''>(p.reviewers[0]?.id ?? '');
  const [submitMessage, setSubmitMessage] = useState('');
  const [decisionMessage, setDecisionMessage] = useState('');
  const [remark, setRemark] = useState('');
  const url = (what: string) => `/api/designs/${p.designId}/revisions/${p.number}/${what}`;

  const send = (what: string, body: unknown, after: () => void) =>
    startTransition(async () => {
      setError(null);
      const answer = await postJson(url(what), body);
      if (!answer.ok) {
        setError({ field: answer.body.issues?.[0]?.path ?? what, message: answerMessage(answer) });
        return;
      }
      after();
      router.refresh();
    });

  const canSubmitNow = p.may.submit;
  const canDecideNow = p.may.decide;

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
          {canSubmitNow && (
            <form
              className="space-y-2"
              aria-label="Submit for review"
              onSubmit={(e) => {
                e.preventDefault();
                send('submit', { reviewerId: reviewerId === '' ? null : Number(reviewerId), message: submitMessage }, () => setSubmitMessage(''));
              }}
            >
              <h3 className="text-sm font-semibold">{p.state === 'changes-requested' ? 'Submit again for review' : 'Submit for review'}</h3>
              {p.reviewers.length === 0 ? (
                <p className="text-sm text-slate-500">Nobody else in this team may review. An admin can add a reviewer on the Team page.</p>
              ) : (
                <>
                  <label className="label" htmlFor="reviewer">
                    Reviewer
                  </label>
                  <select
                    id="reviewer"
                    className={`input ${error?.field === 'reviewerId' ? 'input-error' : ''}`}
                    value={reviewerId}
                    onChange={(e) => setReviewerId(e.target.value === '' ? '' : Number(e.target.value))}
                  >
                    <option value="">Any reviewer of the team</option>
                    {p.reviewers.map((r) => (
                      <option key={r.id} value={r.id}>
                        {r.name} ({r.role})
                      </option>
                    ))}
                  </select>
                  <label className="label" htmlFor="submit-message">
                    Message to the reviewer
                  </label>
                  <textarea
                    id="submit-message"
                    className="input min-h-[70px]"
                    placeholder="What changed and what to look at"
                    value={submitMessage}
                    onChange={(e) => setSubmitMessage(e.target.value)}
                  />
                  <button type="submit" className="btn-primary" disabled={pending}>
                    Submit r{p.number} for review
                  </button>
                </>
              )}
            </form>
          )}

          {p.decideBlockedReason && (
            <p className="rounded-md bg-slate-50 px-3 py-2 text-sm text-slate-600">{p.decideBlockedReason}</p>
          )}

          {canDecideNow && (
            <form className="space-y-2" aria-label="Decision" onSubmit={(e) => e.preventDefault()}>
              <h3 className="text-sm font-semibold">Your decision</h3>
              <label className="label" htmlFor="decision-message">
                Remarks with the decision (required to request changes)
              </label>
              <textarea
                id="decision-message"
                className={`input min-h-[70px] ${error?.field === 'message' ? 'input-error' : ''}`}
                value={decisionMessage}
                onChange={(e) => setDecisionMessage(e.target.value)}
              />
              <div className="flex gap-2">
                <button
                  type="button"
                  className="btn bg-emerald-600 text-white hover:bg-emerald-500"
                  disabled={pending}
                  onClick={() => send('decision', { decision: 'approve', message: decisionMessage }, () => setDecisionMessage(''))}
                >
                  Approve r{p.number}
                </button>
                <button
                  type="button"
                  className="btn bg-rose-600 text-white hover:bg-rose-500"
                  disabled={pending}
                  onClick={() => send('decision', { decision: 'request-changes', message: decisionMessage }, () => setDecisionMessage(''))}
                >
                  Request changes
                </button>
              </div>
            </form>
          )}

          {p.state === 'in-review' && !canDecideNow && (
            <p className="rounded-md border-l-2 border-indigo-300 bg-indigo-50 px-3 py-2 text-sm text-indigo-900" data-testid="waiting-for">
              Waiting for {p.waitingFor ?? 'a reviewer of the team'} to approve r{p.number} or request changes.
            </p>
          )}

          {!canSubmitNow && !canDecideNow && !p.decideBlockedReason && p.state !== 'in-review' && (
            <p className="text-sm text-slate-500">{idleText(p)}</p>
          )}

          {error && (
            <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-700">
              {error.message}
            </p>
          )}
        </div>

        <div className="space-y-3">
          <h3 className="text-sm font-semibold">Activity and remarks</h3>
          <ol className="space-y-2" data-testid="timeline">
            {p.timeline.length === 0 && <li className="text-sm text-slate-500">Nothing yet.</li>}
            {p.timeline.map((t) => (
              <li key={`${t.kind}-${t.id}`} className={`rounded-md px-3 py-2 text-sm ${t.kind === 'event' ? 'border-l-2 border-indigo-300 bg-slate-50' : 'border border-slate-200'}`}>
                <div className="flex flex-wrap items-baseline gap-x-2 text-xs text-slate-500">
                  <span className="font-medium text-slate-800">{t.who}</span>
                  {t.kind === 'event' ? (
                    <span>
                      {EVENT_WORDS[t.state ?? ''] ?? t.state}
                      {t.reviewerName ? ` · reviewer ${t.reviewerName}` : ''}
                    </span>
                  ) : (
                    <span>remarked</span>
                  )}
                  <span className="num ml-auto">{formatDate(t.at)}</span>
                </div>
                {t.text && <p className="mt-1 whitespace-pre-wrap text-slate-800">{t.text}</p>}
              </li>
            ))}
          </ol>
          {p.may.remark && (
            <form
              className="space-y-2"
              aria-label="Add a remark"
              onSubmit={(e) => {
                e.preventDefault();
                send('remarks', { body: remark }, () => setRemark(''));
              }}
            >
              <label className="label" htmlFor="remark">
                Add a remark
              </label>
              <textarea
                id="remark"
                className={`input min-h-[60px] ${error?.field === 'body' ? 'input-error' : ''}`}
                value={remark}
                onChange={(e) => setRemark(e.target.value)}
              />
              <button type="submit" className="btn-secondary" disabled={pending || !remark.trim()}>
                Add remark
              </button>
            </form>
          )}
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
