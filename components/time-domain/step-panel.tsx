'use client';

import { useMemo } from 'react';
import type { Data } from 'plotly.js-dist-min';
import { PlotlyChart } from '@/components/plot/plotly-chart';
import type { StepResponseResult } from '@/lib/engine/step-response';
import type { SwitchingStepResult } from '@/lib/engine/switching-check';
import { formatSi } from '@/lib/units/si';
import { COLORS, timeScale } from './plots';

const mv = (v: number) => `${v < 0 ? '−' : ''}${formatSi(Math.abs(v), 'V')}`;

/** The averaged step response, the settling band and (when run) the switching simulation over it. */
export function StepPlot({ step, switching, height = 320 }: { step: StepResponseResult; switching?: SwitchingStepResult | null; height?: number }) {
  const tEnd = step.t[step.t.length - 1];
  const { factor, unit } = timeScale(tEnd);
  const data = useMemo(() => {
    const t = step.t.map((x) => x * factor);
    const band = step.band * (step.vout[0] ?? 0);
    const traces: Data[] = [];
    if (switching) {
      const ct = switching.cycles.t.map((x) => x * factor);
      traces.push(
        { type: 'scatter', mode: 'lines', x: ct, y: switching.cycles.voutMax, line: { width: 0, color: COLORS.switching }, showlegend: false, hoverinfo: 'skip' },
        { type: 'scatter', mode: 'lines', name: 'Switching: ripple (min to max per cycle)', x: ct, y: switching.cycles.voutMin, fill: 'tonexty', fillcolor: COLORS.band, line: { width: 0, color: COLORS.switching }, hoverinfo: 'skip' },
        { type: 'scatter', mode: 'lines', name: 'Switching: cycle average', x: ct, y: switching.cycles.voutAvg, line: { color: COLORS.switching, width: 1.5 } },
      );
    }
    traces.push(
      { type: 'scatter', mode: 'lines', name: 'Averaged model', x: t, y: step.vout, line: { color: COLORS.closed, width: 2.5 } },
      { type: 'scatter', mode: 'lines', name: `±${(step.band * 100).toPrecision(2)} % band`, x: [t[0], t[t.length - 1]], y: [step.finalVout + band, step.finalVout + band], line: { color: '#94a3b8', dash: 'dot', width: 1 } },
      { type: 'scatter', mode: 'lines', showlegend: false, x: [t[0], t[t.length - 1]], y: [step.finalVout - band, step.finalVout - band], line: { color: '#94a3b8', dash: 'dot', width: 1 }, hoverinfo: 'skip' },
    );
    return traces;
  }, [step, switching, factor]);
  const layout = useMemo(
    () => ({
      height,
      margin: { l: 64, r: 16, t: 12, b: 44 },
      xaxis: { title: { text: `Time after the step (${unit})` }, gridcolor: '#e2e8f0' },
      yaxis: { title: { text: 'Output (V)' }, gridcolor: '#e2e8f0', tickformat: '.4~f' },
      legend: { orientation: 'h' as const, y: -0.22 },
      paper_bgcolor: 'white',
      plot_bgcolor: 'white',
      font: { size: 11 },
    }),
    [unit, height],
  );
  return <PlotlyChart data={data} layout={layout} className={height > 250 ? 'h-[320px]' : 'h-[240px]'} data-testid="step-plot" aria-label="Step response plot" />;
}

/** Peak deviation, overshoot, settling time and the reasons the step leaves the model. */
export function StepReadouts({ step }: { step: StepResponseResult }) {
  return (
    <div className="space-y-2">
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-3" data-testid="step-readouts">
        <div>
          <dt className="text-slate-500">Peak deviation</dt>
          <dd className="num font-mono">{mv(step.peakDeviation)}</dd>
        </div>
        <div>
          <dt className="text-slate-500">Overshoot past the final value</dt>
          <dd className="num font-mono">{mv(step.overshoot)}</dd>
        </div>
        <div>
          <dt className="text-slate-500">Settling time to ±{(step.band * 100).toPrecision(2)} %</dt>
          <dd className="num font-mono">{step.settlingTime === null ? 'not settled in the window' : step.settlingTime === 0 ? 'never leaves the band' : formatSi(step.settlingTime, 's')}</dd>
        </div>
      </dl>
      {step.outsideModel.length > 0 && (
        <div className="rounded-md border border-red-200 bg-red-50 p-2 text-sm text-red-800" role="status" data-testid="outside-model">
          <p className="font-semibold">Outside the small-signal model</p>
          <ul className="ml-4 list-disc">
            {step.outsideModel.map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
