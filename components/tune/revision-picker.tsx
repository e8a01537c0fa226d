'use client';

import { formatDateTime } from '@/lib/format';
import { useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { revisionsQueryOptions, type RevisionListItem } from '@/lib/queries/revisions';

type Brief = Pick<RevisionListItem, 'number' | 'note' | 'authorName' | 'createdAt'>;

/** Links to each saved revision of the design; the latest opens for editing, earlier ones read-only. */
export function RevisionPicker({ designId, shown, initial }: { designId: number; shown: number | null; initial: Brief[] }) {
  const { data, isError } = useQuery({
    ...revisionsQueryOptions(designId),
    select: (d) => d.revisions as Brief[],
    initialData: { revisions: initial as RevisionListItem[] },
  });
  const list = data ?? initial;
  if (list.length === 0) return <span className="text-sm text-slate-500">No revision saved yet</span>;
  const latest = list[list.length - 1].number;
  return (
    <nav className="flex flex-wrap items-center gap-1 text-sm" aria-label="Revisions" data-testid="revision-picker">
      <span className="mr-1 text-xs font-medium uppercase tracking-wide text-slate-500">Revisions</span>
      {list.map((r) => (
        <Link
          key={r.number}
          href={r.number === latest ? `/designs/${designId}` : `/designs/${designId}?r=${r.number}`}
          aria-current={r.number === shown ? 'page' : undefined}
          title={`${r.note || 'no note'} — ${r.authorName}, ${formatDateTime(r.createdAt)}`}
          className={`rounded px-2 py-0.5 font-mono text-xs ${
            r.number === shown ? 'bg-indigo-600 text-white' : 'bg-slate-100 text-slate-700 hover:bg-slate-200'
          }`}
        >
          r{r.number}
        </Link>
      ))}
      {isError && <span className="text-xs text-red-700">(could not refresh the list)</span>}
    </nav>
  );
}
