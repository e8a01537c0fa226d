'use client';

import type { SignoffState } from '@/lib/catalog/signoff';
import Link from 'next/link';
import { useState } from 'react';
import { SignoffBadge } from '@/components/designs/signoff-badge';
import { formatSi } from '@/lib/units/si';
import { formatDateTime } from '@/lib/format';

export interface RevisionRow {
  number: number;
  baseNumber: number | null;
  authorName: string;
  createdAt: string;
  note: string;
  crossoverHz: number | null;
  phaseMarginDeg: number | null;
  gainMarginDb: number | null;
  state: SignoffState;
}

/** Revisions newest first; tick two to Compare, click a number to open its sign-off. */
export function RevisionTable({ designId, rows, selected }: { designId: number; rows: RevisionRow[]; selected: number | null }) {
  const [picked, setPicked] = useState<number[]>([]);
  const toggle = (n: number) =>
    setPicked((p) => (p.includes(n) ? p.filter((x) => x !== n) : [...p, n].slice(-2)));
  const [a, b] = [...picked].sort((x, y) => x - y);
  const base = `/designs/${designId}`;

  return (
    <div className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-3 py-2">
        <h2 className="font-semibold">Revisions</h2>
        <span className="text-xs text-slate-500">Tick two to compare them · click a number for its sign-off and remarks</span>
        <div className="ml-auto flex items-center gap-2">
          {picked.length > 0 && (
            <button type="button" className="text-xs text-slate-500 hover:underline" onClick={() => setPicked([])}>
              Clear
            </button>
          )}
          {picked.length === 2 ? (
            <Link href={`${base}/compare?a=${a}&b=${b}`} className="btn-primary" data-testid="compare-picked">
              Compare r{a} ↔ r{b}
            </Link>
          ) : (
            <span className="btn-secondary pointer-events-none opacity-60" aria-disabled="true">
              Compare {picked.length === 1 ? `r${picked[0]} ↔ …` : 'two revisions'}
            </span>
          )}
        </div>
      </div>
      <div className="overflow-x-auto">
        <table className="table-base" data-testid="revisions-table">
          <thead>
            <tr>
              <th className="w-10">
                <span className="sr-only">Pick to compare</span>
              </th>
              <th>Rev</th>
              <th>Author</th>
              <th>Saved</th>
              <th>Note</th>
              <th className="text-right">fc</th>
              <th className="text-right">PM</th>
              <th className="text-right">GM</th>
              <th>Sign-off</th>
              <th>
                <span className="sr-only">Changes</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const isSelected = r.number === selected;
              const prev = r.baseNumber ?? (r.number > 1 ? r.number - 1 : null);
              return (
                <tr key={r.number} className={isSelected ? 'bg-indigo-50' : 'hover:bg-slate-50'} data-revision={r.number} aria-selected={isSelected}>
                  <td>
                    <input
                      type="checkbox"
                      className="h-4 w-4 accent-indigo-600"
                      aria-label={`Pick r${r.number} to compare`}
                      checked={picked.includes(r.number)}
                      onChange={() => toggle(r.number)}
                    />
                  </td>
                  <td className="num font-medium">
                    <Link href={`${base}/history?r=${r.number}`} scroll={false} className="text-indigo-700 hover:underline">
                      r{r.number}
                    </Link>
                  </td>
                  <td className="whitespace-nowrap">{r.authorName}</td>
                  <td className="num whitespace-nowrap text-slate-600" title={r.createdAt}>
                    {formatDateTime(r.createdAt)}
                  </td>
                  <td className="max-w-xs truncate text-slate-700" title={r.note}>
                    {r.note || <span className="text-slate-400">—</span>}
                  </td>
                  <td className="num whitespace-nowrap text-right">{r.crossoverHz === null ? '—' : formatSi(r.crossoverHz, 'Hz')}</td>
                  <td className="num whitespace-nowrap text-right">{r.phaseMarginDeg === null ? '—' : `${r.phaseMarginDeg.toFixed(1)}°`}</td>
                  <td className="num whitespace-nowrap text-right">{r.gainMarginDb === null ? '—' : `${r.gainMarginDb.toFixed(1)} dB`}</td>
                  <td>
                    <SignoffBadge state={r.state} />
                  </td>
                  <td className="space-x-3 whitespace-nowrap text-right">
                    <Link href={`${base}?r=${r.number}`} className="text-xs text-indigo-700 hover:underline" title={`Open r${r.number} on Tune`}>
                      Open
                    </Link>
                    {prev && (
                      <Link href={`${base}/compare?a=${prev}&b=${r.number}`} className="text-xs text-indigo-700 hover:underline" title={`What changed from r${prev} to r${r.number}`}>
                        vs r{prev}
                      </Link>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
