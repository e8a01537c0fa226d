'use client';

import { keepPreviousData, useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { useSearchParams } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import type { DesignPage } from '@/db/queries/designs';
import { designListQueryOptions } from '@/lib/queries/designs';
import { topologyLabel } from '@/lib/catalog/topologies';
import {
  DESIGN_STATUSES,
  defaultSortDir,
  designListSearch,
  readDesignListQuery,
  type DesignListQuery,
  type DesignSort,
} from '@/lib/designs-list-query';
import { SignoffBadge } from './signoff-badge';

const COLUMNS: { key: DesignSort; label: string }[] = [
  { key: 'name', label: 'Name' },
  { key: 'topology', label: 'Topology' },
  { key: 'latestRevision', label: 'Latest revision' },
  { key: 'signoffState', label: 'Sign-off' },
  { key: 'updatedAt', label: 'Updated' },
];

const STATUS_LABELS: Record<(typeof DESIGN_STATUSES)[number], string> = {
  unsaved: 'Not saved',
  draft: 'Draft',
  'in-review': 'In review',
  approved: 'Approved',
  'changes-requested': 'Changes requested',
};

/**
 * The designs list: filters, sort and page live in the URL (Back returns to the previous page
 * or filter); rows come 100 at a time from GET /api/designs. The server renders the first page.
 */
export function DesignsTable({
  teamId,
  initial,
  initialSearch,
  emptyText = 'No designs yet.',
}: {
  teamId: number;
  initial: DesignPage;
  initialSearch: string;
  /** What an empty, unfiltered view says (active, waiting for my review, archived). */
  emptyText?: string;
}) {
  const searchParams = useSearchParams();
  const query = readDesignListQuery(searchParams);
  const search = designListSearch(query);
  const list = useQuery({
    ...designListQueryOptions(teamId, search),
    initialData: search === initialSearch ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const data = list.data ?? initial;
  const dir = query.dir ?? defaultSortDir(query.sort);

  // Next.js keeps useSearchParams in step with the History API, without a server round trip.
  const go = (next: Partial<DesignListQuery>, mode: 'push' | 'replace' = 'push') => {
    const s = designListSearch({ ...query, ...next });
    const url = s ? `?${s}` : window.location.pathname;
    if (mode === 'push') window.history.pushState(null, '', url);
    else window.history.replaceState(null, '', url);
  };

  // Typing filters after a short pause and replaces the URL (no history entry per keystroke).
  const [text, setText] = useState(query.q);
  const typed = useRef(query.q);
  useEffect(() => {
    if (typed.current !== query.q) setText(query.q); // Back/Forward changed the filter
    typed.current = query.q;
  }, [query.q]);
  useEffect(() => {
    if (text.trim() === query.q) return;
    const t = setTimeout(() => {
      typed.current = text.trim();
      go({ q: text.trim(), page: 1 }, 'replace');
    }, 250);
    return () => clearTimeout(t);
  }, [text, query.q]); // eslint-disable-line react-hooks/exhaustive-deps

  const pages = Math.max(1, Math.ceil(data.total / data.pageSize));
  const first = data.total === 0 ? 0 : (data.page - 1) * data.pageSize + 1;
  const last = (data.page - 1) * data.pageSize + data.designs.length;
  const filtered = query.q !== '' || query.topology !== 'all' || query.status !== 'all';

  return (
    <div className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 p-3">
        <input
          type="search"
          placeholder="Filter by name, description or owner"
          aria-label="Filter designs"
          className="input max-w-sm"
          value={text}
          onChange={(e) => setText(e.target.value)}
        />
        <select aria-label="Topology" className="input w-40" value={query.topology} onChange={(e) => go({ topology: e.target.value as DesignListQuery['topology'], page: 1 })}>
          <option value="all">All topologies</option>
          <option value="buck">Buck</option>
          <option value="boost">Boost</option>
          <option value="buck-boost">Buck-boost</option>
        </select>
        <select aria-label="Sign-off" className="input w-48" value={query.status} onChange={(e) => go({ status: e.target.value as DesignListQuery['status'], page: 1 })}>
          <option value="all">Any sign-off state</option>
          {DESIGN_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LABELS[s]}
            </option>
          ))}
        </select>
        <span className="ml-auto text-xs text-slate-500" data-testid="designs-count">
          {data.total === 0 ? 'none' : `${first}–${last} of ${data.total}`}
          {list.isFetching && <span className="ml-2 text-slate-400">updating…</span>}
        </span>
      </div>
      {list.isError && (
        <p className="border-b border-rose-200 bg-rose-50 px-3 py-2 text-sm text-rose-800" role="alert">
          The list could not be loaded: {list.error.message}
        </p>
      )}
      <table className={`table-base ${list.isPlaceholderData ? 'opacity-60' : ''}`} data-testid="designs-table">
        <thead>
          <tr>
            {COLUMNS.map((c) => (
              <th key={c.key} aria-sort={query.sort === c.key ? (dir === 'asc' ? 'ascending' : 'descending') : 'none'}>
                <button
                  type="button"
                  className="inline-flex items-center gap-1 uppercase hover:text-slate-800"
                  onClick={() =>
                    go({ sort: c.key, dir: query.sort === c.key ? (dir === 'asc' ? 'desc' : 'asc') : defaultSortDir(c.key), page: 1 })
                  }
                >
                  {c.label}
                  <span aria-hidden="true">{query.sort === c.key ? (dir === 'asc' ? '▲' : '▼') : ''}</span>
                </button>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {data.designs.map((d) => (
            <tr key={d.id} className="hover:bg-slate-50">
              <td>
                <Link href={`/designs/${d.id}`} className="font-medium text-indigo-700 hover:underline">
                  {d.name}
                </Link>
                {d.archivedAt && <span className="ml-2 rounded bg-slate-200 px-1.5 py-0.5 text-xs text-slate-600">archived</span>}
                {d.description && <div className="text-xs text-slate-500">{d.description}</div>}
              </td>
              <td>{topologyLabel(d.topology)}</td>
              <td className="num">{d.latestRevision ? `r${d.latestRevision}` : <span className="text-slate-400">not saved</span>}</td>
              <td>
                <SignoffBadge state={d.signoffState} />
              </td>
              <td className="num text-slate-600" title={d.updatedAt}>
                {new Date(d.updatedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}
              </td>
            </tr>
          ))}
          {data.designs.length === 0 && (
            <tr>
              <td colSpan={5} className="py-10 text-center text-slate-500">
                {filtered ? 'No design matches the filter.' : emptyText}
              </td>
            </tr>
          )}
        </tbody>
      </table>
      {pages > 1 && (
        <nav className="flex items-center justify-end gap-2 border-t border-slate-200 p-3 text-sm" aria-label="Pages">
          <button type="button" className="btn-secondary" disabled={data.page <= 1} onClick={() => go({ page: data.page - 1 })}>
            ‹ Previous
          </button>
          <span className="text-slate-600" data-testid="designs-page">
            Page {data.page} of {pages}
          </span>
          <button type="button" className="btn-secondary" disabled={data.page >= pages} onClick={() => go({ page: data.page + 1 })}>
            Next ›
          </button>
        </nav>
      )}
    </div>
  );
}
