'use client';

import type { CornersResult } from '@/lib/engine/corners';
import type { MarginTargets } from '@/lib/engine/range';
import { checkLabel } from '@/lib/catalog';
import { formatSi } from '@/lib/units/si';

const fixed = (v: number | null, unit: string) => (v === null ? '—' : `${v.toFixed(1).replace(/^-/, '−')}${unit}`);

/** Every corner with the values it used; the worst-PM row (and the worst-GM row) highlighted. */
export function CornerTable({ result, targets }: { result: CornersResult; targets: MarginTargets }) {
  const { corners, worst } = result;
  const wPm = worst.phaseMarginDeg.corner;
  const wGm = worst.gainMarginDb.corner;
  return (
    <div className="max-h-80 overflow-auto rounded-md border border-slate-200">
      <table className="w-full text-xs" data-testid="corner-table">
        <caption className="sr-only">Margins at every corner of the operating range</caption>
        <thead className="sticky top-0 bg-slate-50 text-left text-[11px] uppercase tracking-wide text-slate-500">
          <tr>
            <th className="px-2 py-1">#</th>
            <th className="px-2 py-1">Vin</th>
            <th className="px-2 py-1">Iout</th>
            <th className="px-2 py-1">L</th>
            <th className="px-2 py-1">C</th>
            <th className="px-2 py-1">ESR</th>
            <th className="px-2 py-1">Mode</th>
            <th className="px-2 py-1">D</th>
            <th className="px-2 py-1 text-right">fc</th>
            <th className="px-2 py-1 text-right">PM</th>
            <th className="px-2 py-1 text-right">GM</th>
            <th className="px-2 py-1">Risk</th>
          </tr>
        </thead>
        <tbody className="num font-mono">
          {corners.map((k, i) => {
            const isWorst = i === wPm;
            const pmLow = k.margins.phaseMarginDeg === null || k.margins.phaseMarginDeg < targets.phaseMarginDeg;
            const gmLow = k.margins.gainMarginDb !== null && k.margins.gainMarginDb < targets.gainMarginDb;
            return (
              <tr
                key={i}
                className={isWorst ? 'bg-red-50 font-semibold text-red-900' : i === wGm ? 'bg-amber-50' : 'odd:bg-white even:bg-slate-50/60'}
                title={k.label}
                data-worst={isWorst ? 'pm' : i === wGm ? 'gm' : undefined}
              >
                <td className="px-2 py-0.5 text-slate-500">{i + 1}</td>
                <td className="px-2 py-0.5">{formatSi(k.vin, 'V')}</td>
                <td className="px-2 py-0.5">{formatSi(k.iout, 'A')}</td>
                <td className="px-2 py-0.5">{formatSi(k.l, 'H')}</td>
                <td className="px-2 py-0.5">{formatSi(k.c, 'F')}</td>
                <td className="px-2 py-0.5">{formatSi(k.rc, 'Ω')}</td>
                <td className={`px-2 py-0.5 ${k.conduction === 'DCM' ? 'text-indigo-700' : ''}`}>{k.conduction}</td>
                <td className="px-2 py-0.5">{k.duty.toFixed(3)}</td>
                <td className="px-2 py-0.5 text-right">{k.margins.crossoverHz === null ? 'none' : formatSi(k.margins.crossoverHz, 'Hz')}</td>
                <td className={`px-2 py-0.5 text-right ${pmLow ? 'text-red-700' : ''}`}>{fixed(k.margins.phaseMarginDeg, '°')}</td>
                <td className={`px-2 py-0.5 text-right ${gmLow ? 'text-red-700' : ''}`}>{k.margins.gainMarginDb === null ? 'none' : fixed(k.margins.gainMarginDb, ' dB')}</td>
                <td className="px-2 py-0.5 font-sans text-red-700" title={k.risks.map((r) => r.message).join('\n') || undefined}>
                  {k.risks.map((r) => checkLabel(r.id)).join(', ')}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
