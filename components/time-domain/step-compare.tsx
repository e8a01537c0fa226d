'use client';

import { useMemo } from 'react';
import type { Data } from 'plotly.js-dist-min';
import { PlotlyChart } from '@/components/plot/plotly-chart';
import { formatSi } from '@/lib/units/si';
import { timeScale } from './plots';

export interface CompareStep {
  label: string;
  t: number[];
  vout: number[];
  peakDeviation: number;
  settlingTime: number | null;
  outsideModel: string[];
}

const STYLE = { a: { color: '#64748b', dash: 'dash' as const }, b: { color: '#4f46e5', dash: 'solid' as const } };

/** Both revisions' responses to the same step, A muted and dashed, B in the loop colour. */
export function StepCompare({ a, b, title }: { a: CompareStep; b: CompareStep; title: string }) {
  const tEnd = Math.max(a.t[a.t.length - 1], b.t[b.t.length - 1]);
  const { factor, unit } = timeScale(tEnd);
  const data = useMemo<Data[]>(
    () =>
      (
        [
          ['a', a],
          ['b', b],
        ] as const
      ).map(([k, s]) => ({ type: 'scatter', mode: 'lines', name: s.label, x: s.t.map((x) => x * factor), y: s.vout, line: { color: STYLE[k].color, dash: STYLE[k].dash, width: 2.5 } })),
    [a, b, factor],
  );
  const layout = useMemo(
    () => ({
      height: 280,
      margin: { l: 64, r: 16, t: 12, b: 44 },
      xaxis: { title: { text: `Time after the step (${unit})` }, gridcolor: '#e2e8f0' },
      yaxis: { title: { text: 'Output (V)' }, gridcolor: '#e2e8f0', tickformat: '.4~f' },
      legend: { orientation: 'h' as const, y: -0.25 },
      paper_bgcolor: 'white',
      plot_bgcolor: 'white',
      font: { size: 11 },
    }),
    [unit],
  );
  const row = (s: CompareStep) => (
    <tr key={s.label} className="border-t border-slate-100">
      <td className="py-1 font-semibold">{s.label}</td>
      <td>{`${s.peakDeviation < 0 ? '−' : ''}${formatSi(Math.abs(s.peakDeviation), 'V')}`}</td>
      <td>{s.settlingTime === null ? 'not settled' : formatSi(s.settlingTime, 's')}</td>
      <td className="font-sans text-xs text-red-700">{s.outsideModel.join('; ')}</td>
    </tr>
  );
  return (
    <section className="card space-y-2 p-4" aria-label="Step responses" data-testid="step-compare">
      <h2 className="text-sm font-semibold text-slate-800">Step response: {title}</h2>
      <PlotlyChart data={data} layout={layout} className="h-[280px]" aria-label="Step responses of both revisions" />
      <table className="w-full text-sm">
        <thead>
          <tr className="text-left text-xs text-slate-500">
            <th className="py-1">Revision</th>
            <th>Peak deviation</th>
            <th>Settling time</th>
            <th>Outside the model</th>
          </tr>
        </thead>
        <tbody className="num font-mono">{[a, b].map(row)}</tbody>
      </table>
    </section>
  );
}
