'use client';

import { useMemo } from 'react';
import type { Data } from 'plotly.js-dist-min';
import { PlotlyChart } from '@/components/plot/plotly-chart';
import type { ModelCheckPoint } from '@/lib/engine/switching-check';
import type { BodeData } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import { COLORS } from './plots';

const signed = (v: number, digits: number) => `${v < 0 ? '−' : '+'}${Math.abs(v).toFixed(digits)}`;

/** The averaged loop gain with the switching check's points on it, and the model's error at each. */
export function ModelCheckPlot({ bode, points }: { bode: BodeData; points: ModelCheckPoint[] }) {
  const data = useMemo<Data[]>(() => {
    const hz = points.map((p) => p.hz);
    const hover = points.map((p) => `${formatSi(p.hz, 'Hz')}: model error ${signed(p.errorDb, 2)} dB, ${signed(p.errorDeg, 1)}°`);
    return [
      { type: 'scatter', mode: 'lines', name: 'Loop gain T, averaged model', x: bode.f, y: bode.loop.magDb, line: { color: COLORS.closed, width: 2 } },
      { type: 'scatter', mode: 'lines', name: 'Phase of T', x: bode.f, y: bode.loop.phaseDeg, yaxis: 'y2', line: { color: COLORS.closed, width: 1.5, dash: 'dash' } },
      { type: 'scatter', mode: 'markers', name: 'Switching check |T|', x: hz, y: points.map((p) => p.magDb), text: hover, hoverinfo: 'text', marker: { color: COLORS.switching, size: 9, symbol: 'circle' } },
      { type: 'scatter', mode: 'markers', name: 'Switching check ∠T', x: hz, y: points.map((p) => p.phaseDeg), yaxis: 'y2', text: hover, hoverinfo: 'text', marker: { color: COLORS.switching, size: 8, symbol: 'diamond-open' } },
    ];
  }, [bode, points]);
  const layout = useMemo(
    () => ({
      height: 320,
      margin: { l: 60, r: 60, t: 12, b: 44 },
      xaxis: { type: 'log' as const, title: { text: 'Frequency (Hz)' }, exponentformat: 'SI' as const, gridcolor: '#e2e8f0' },
      yaxis: { title: { text: 'Magnitude (dB)' }, gridcolor: '#e2e8f0' },
      yaxis2: { title: { text: 'Phase (°)' }, overlaying: 'y' as const, side: 'right' as const, showgrid: false },
      legend: { orientation: 'h' as const, y: -0.22 },
      paper_bgcolor: 'white',
      plot_bgcolor: 'white',
      font: { size: 11 },
    }),
    [],
  );
  return <PlotlyChart data={data} layout={layout} className="h-[320px]" data-testid="model-check-plot" aria-label="Model check on the Bode plot" />;
}

export function ModelCheckTable({ points }: { points: ModelCheckPoint[] }) {
  return (
    <table className="w-full text-sm" data-testid="model-check-table">
      <thead>
        <tr className="text-left text-xs text-slate-500">
          <th className="py-1">Frequency</th>
          <th>Switching |T|</th>
          <th>Model |T|</th>
          <th>Error</th>
          <th>Switching ∠T</th>
          <th>Model ∠T</th>
          <th>Error</th>
        </tr>
      </thead>
      <tbody className="num font-mono">
        {points.map((p) => (
          <tr key={p.hz} className="border-t border-slate-100">
            <td className="py-1">{formatSi(p.hz, 'Hz')}</td>
            <td>{p.magDb.toFixed(2)} dB</td>
            <td>{p.modelMagDb.toFixed(2)} dB</td>
            <td className={Math.abs(p.errorDb) > 1 ? 'text-red-700' : ''}>{signed(p.errorDb, 2)} dB</td>
            <td>{p.phaseDeg.toFixed(1)}°</td>
            <td>{p.modelPhaseDeg.toFixed(1)}°</td>
            <td className={Math.abs(p.errorDeg) > 5 ? 'text-red-700' : ''}>{signed(p.errorDeg, 1)}°</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
