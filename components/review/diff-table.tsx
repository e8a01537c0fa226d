'use client';

import { Fragment, useState } from 'react';
import type { DiffRow } from '@/lib/revision-diff';
import { formatChange, formatValue } from './format';

function changeTone(r: DiffRow): string {
  if (!r.changed) return 'text-slate-400';
  if (r.higherIsBetter && typeof r.a === 'number' && typeof r.b === 'number') return r.b > r.a ? 'text-emerald-700' : 'text-rose-700';
  return 'text-amber-800';
}

/** Every input, part and margin of A and B; changed cells marked, optionally only those. */
export function DiffTable({ rows, labelA, labelB }: { rows: DiffRow[]; labelA: string; labelB: string }) {
  const changedCount = rows.filter((r) => r.changed).length;
  const [onlyChanged, setOnlyChanged] = useState(false);
  const shown = onlyChanged ? rows.filter((r) => r.changed) : rows;
  const groups = [...new Set(shown.map((r) => r.group))];

  return (
    <div className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-3 py-2">
        <h2 className="font-semibold">Differences</h2>
        <span className="text-sm text-slate-600" data-testid="changed-count">
          {changedCount} of {rows.length} values changed
        </span>
        <label className="ml-auto flex items-center gap-2 text-sm text-slate-600">
          <input type="checkbox" className="accent-indigo-600" checked={onlyChanged} onChange={(e) => setOnlyChanged(e.target.checked)} />
          Only what changed
        </label>
      </div>
      <table className="table-base" data-testid="diff-table">
        <thead>
          <tr>
            <th>Quantity</th>
            <th className="text-right !normal-case">{labelA} (A)</th>
            <th className="text-right !normal-case">{labelB} (B)</th>
            <th className="text-right">Change</th>
          </tr>
        </thead>
        <tbody>
          {groups.map((g) => (
            <Fragment key={g}>
              <tr>
                <td colSpan={4} className="bg-slate-50 text-xs font-semibold uppercase tracking-wide text-slate-500">
                  {g}
                </td>
              </tr>
              {shown
                .filter((r) => r.group === g)
                .map((r) => {
                  const mark = r.changed ? 'bg-amber-50 font-medium' : '';
                  return (
                    <tr key={r.key} data-key={r.key} data-changed={r.changed ? 'true' : 'false'}>
                      <td className={r.changed ? 'border-l-4 border-l-amber-400' : 'border-l-4 border-l-transparent'}>
                        {r.label}
                        {r.changed && <span className="sr-only"> (changed)</span>}
                      </td>
                      <td className={`num text-right ${r.changed ? 'text-slate-500' : ''}`}>{formatValue(r.kind, r.a, r.unit)}</td>
                      <td className={`num text-right ${mark}`}>{formatValue(r.kind, r.b, r.unit)}</td>
                      <td className={`num whitespace-nowrap text-right ${changeTone(r)}`}>{r.changed ? formatChange(r.kind, r.a, r.b, r.unit) : 'same'}</td>
                    </tr>
                  );
                })}
            </Fragment>
          ))}
          {shown.length === 0 && (
            <tr>
              <td colSpan={4} className="py-8 text-center text-slate-500">
                Nothing differs between {labelA} and {labelB}.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
