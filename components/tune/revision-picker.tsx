'use client';

import Link from 'next/link';
import { useState } from 'react';
import { formatCount, formatDateTime } from '@/lib/format';
import type { RevisionBriefPage } from '@/lib/queries/revisions';
import { RevisionFind } from '@/components/revisions/revision-find';
import { useRevisionPage } from '@/components/revisions/use-revision-page';

/**
 * Links to the design's saved revisions, 100 at a time (the page holding the one shown, oldest to
 * newest left to right; Older/Newer page through the API). On Tune the latest opens for editing,
 * earlier ones read-only; Handoff uses the same picker. A design with thousands of revisions opens
 * with one page of them.
 */
export function RevisionPicker({
  designId,
  shown,
  initial,
  path = `/designs/${designId}`,
  label = 'Revisions',
}: {
  designId: number;
  shown: number | null;
  initial: RevisionBriefPage;
  /** The screen each link opens (`?r=N` added for all but the latest): Tune by default, or Handoff. */
  path?: string;
  label?: string;
}) {
  const { data, range, newer, older, goTo, loading, isError } = useRevisionPage(designId, initial);
  const [found, setFound] = useState<number | null>(null);
  if (data.total === 0) return <span className="text-sm text-slate-500">No revision saved yet</span>;
  // Numbers run 1…latest without gaps, so the count is the latest number.
  const latest = data.total;
  const paged = data.lastPage > 1;
  const step = 'rounded px-1.5 py-0.5 text-xs text-indigo-700 hover:bg-indigo-50 disabled:text-slate-300 disabled:hover:bg-transparent';
  const links = [...data.revisions].reverse().map((r) => (
    <Link
      key={r.number}
      href={r.number === latest ? path : `${path}?r=${r.number}`}
      aria-current={r.number === shown ? 'page' : undefined}
      title={`${r.note || 'no note'} — ${r.authorName}, ${formatDateTime(r.createdAt)}`}
      data-found={r.number === found || undefined}
      className={`rounded px-2 py-0.5 font-mono text-xs ${r.number === shown ? 'bg-indigo-600 text-white' : 'bg-slate-100 text-slate-700 hover:bg-slate-200'} ${r.number === found ? 'ring-2 ring-amber-400' : ''}`}
    >
      r{r.number}
    </Link>
  ));
  const heading = <span className="mr-1 text-xs font-medium uppercase tracking-wide text-slate-500">{label}</span>;
  const failed = isError && <span className="text-xs text-red-700">(could not load the list)</span>;
  if (!paged)
    return (
      <nav className="flex flex-wrap items-center gap-1 text-sm" aria-label={label} data-testid="revision-picker">
        {heading}
        <div className="contents" data-testid="revision-chips">
          {links}
        </div>
        {failed}
      </nav>
    );
  // More than a page: a line to page with, the page's links below it.
  return (
    <nav className="w-full space-y-1 text-sm" aria-label={label} data-testid="revision-picker" aria-busy={loading || undefined}>
      <div className="flex flex-wrap items-center gap-2">
        {heading}
        <button type="button" className={step} onClick={older ?? undefined} disabled={!older} data-testid="revisions-older" aria-label="Older revisions">
          ‹ Older
        </button>
        <span className="num text-xs text-slate-600" data-testid="revisions-range">
          {range ? `r${range.oldest}–r${range.newest}` : ''} of {formatCount(data.total)}
        </span>
        <button type="button" className={step} onClick={newer ?? undefined} disabled={!newer} data-testid="revisions-newer" aria-label="Newer revisions">
          Newer ›
        </button>
        <RevisionFind
          latest={latest}
          idPrefix={`revisions-${designId}`}
          onFind={(n) => {
            setFound(n);
            goTo(n);
          }}
        />
        {failed}
      </div>
      <div className={`flex flex-wrap gap-1 ${loading ? 'opacity-60' : ''}`} data-testid="revision-chips">
        {links}
      </div>
    </nav>
  );
}
