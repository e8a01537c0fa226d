'use client';

import Link from 'next/link';
import { useMemo, useState } from 'react';
import type { DesignListItem } from '@/db/queries/designs';
import { topologyLabel } from '@/lib/topology';
import { SignoffBadge } from './signoff-badge';

type SortKey = 'name' | 'topology' | 'latestRevision' | 'signoffState' | 'updatedAt';

const COLUMNS: { key: SortKey; label: string }[] = [
  { key: 'name', label: 'Name' },
  { key: 'topology', label: 'Topology' },
  { key: 'latestRevision', label: 'Latest revision' },
  { key: 'signoffState', label: 'Sign-off' },
  { key: 'updatedAt', label: 'Updated' },
];

export function DesignsTable({ designs, emptyText = 'No designs yet.' }: { designs: DesignListItem[]; emptyText?: string }) {
  const [filter, setFilter] = useState('');
  const [topology, setTopology] = useState<string>('all');
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'updatedAt', dir: -1 });

  const rows = useMemo(() => {
    const q = filter.trim().toLowerCase();
    return designs
      .filter((d) => topology === 'all' || d.topology === topology)
      .filter((d) => !q || d.name.toLowerCase().includes(q) || d.description.toLowerCase().includes(q) || d.ownerName.toLowerCase().includes(q))
      .sort((a, b) => {
        const va = a[sort.key] ?? '';
        const vb = b[sort.key] ?? '';
        return (va < vb ? -1 : va > vb ? 1 : 0) * sort.dir;
      });
  }, [designs, filter, topology, sort]);

  return (
    <div className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 p-3">
        <input
          type="search"
          placeholder="Filter by name, description or owner"
          aria-label="Filter designs"
          className="input max-w-sm"
          value={filter}
          onChange={(e) => setFilter(e.target.value)}
        />
        <select aria-label="Topology" className="input w-40" value={topology} onChange={(e) => setTopology(e.target.value)}>
          <option value="all">All topologies</option>
          <option value="buck">Buck</option>
          <option value="boost">Boost</option>
          <option value="buck-boost">Buck-boost</option>
        </select>
        <span className="ml-auto text-xs text-slate-500">
          {rows.length} of {designs.length}
        </span>
      </div>
      <table className="table-base" data-testid="designs-table">
        <thead>
          <tr>
            {COLUMNS.map((c) => (
              <th key={c.key} aria-sort={sort.key === c.key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}>
                <button
                  type="button"
                  className="inline-flex items-center gap-1 uppercase hover:text-slate-800"
                  onClick={() => setSort((s) => ({ key: c.key, dir: s.key === c.key ? (s.dir === 1 ? -1 : 1) : 1 }))}
                >
                  {c.label}
                  <span aria-hidden="true">{sort.key === c.key ? (sort.dir === 1 ? '▲' : '▼') : ''}</span>
                </button>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((d) => (
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
          {rows.length === 0 && (
            <tr>
              <td colSpan={5} className="py-10 text-center text-slate-500">
                {designs.length === 0 ? emptyText : 'No design matches the filter.'}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
