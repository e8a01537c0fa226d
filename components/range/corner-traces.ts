/**
 * The corners on the Tune Bode plot, as extra Plotly traces: a faint family of loop curves
 * (the worst-PM corner drawn stronger), or the band between their lowest and highest value
 * at each frequency. Pure functions of the data.
 */
import type { Data } from 'plotly.js-dist-min';
import type { CornerResult } from '@/lib/engine/corners';

export type CornerView = 'off' | 'family' | 'band';

export const CORNER_COLOR = 'rgba(79, 70, 229, 0.22)';
const BAND_FILL = 'rgba(79, 70, 229, 0.14)';
const WORST_COLOR = 'rgba(220, 38, 38, 0.75)';

const panels = [
  { key: 'magDb', xaxis: 'x', yaxis: 'y', unit: 'dB' },
  { key: 'phaseDeg', xaxis: 'x2', yaxis: 'y2', unit: '°' },
] as const;

export function cornerTraces(f: number[], corners: CornerResult[], view: CornerView, worst: number | null): Data[] {
  const withLoop = corners.filter((k) => k.loop);
  if (view === 'off' || withLoop.length === 0) return [];
  const out: Data[] = [];
  if (view === 'family') {
    corners.forEach((k, i) => {
      if (!k.loop) return;
      const isWorst = i === worst;
      for (const p of panels)
        out.push({
          type: 'scatter',
          mode: 'lines',
          x: f,
          y: k.loop[p.key],
          xaxis: p.xaxis,
          yaxis: p.yaxis,
          showlegend: false,
          line: { color: isWorst ? WORST_COLOR : CORNER_COLOR, width: isWorst ? 1.75 : 1, dash: isWorst ? 'dash' : 'solid' },
          hovertemplate: `corner ${i + 1}${isWorst ? ' (worst PM)' : ''}: ${k.label}<br>%{x:.3s}Hz · %{y:.1f} ${p.unit}<extra></extra>`,
        });
    });
    return out;
  }
  for (const p of panels) {
    const lo = f.map((_, j) => Math.min(...withLoop.map((k) => k.loop![p.key][j])));
    const hi = f.map((_, j) => Math.max(...withLoop.map((k) => k.loop![p.key][j])));
    const common = { type: 'scatter' as const, mode: 'lines' as const, x: f, xaxis: p.xaxis, yaxis: p.yaxis, showlegend: false, line: { width: 0, color: BAND_FILL } };
    out.push(
      { ...common, y: lo, hovertemplate: `corners, lowest<br>%{x:.3s}Hz · %{y:.1f} ${p.unit}<extra></extra>` },
      { ...common, y: hi, fill: 'tonexty', fillcolor: BAND_FILL, hovertemplate: `corners, highest<br>%{x:.3s}Hz · %{y:.1f} ${p.unit}<extra></extra>` },
    );
  }
  if (worst !== null && corners[worst]?.loop)
    for (const p of panels)
      out.push({
        type: 'scatter',
        mode: 'lines',
        x: f,
        y: corners[worst].loop![p.key],
        xaxis: p.xaxis,
        yaxis: p.yaxis,
        showlegend: false,
        line: { color: WORST_COLOR, width: 1.5, dash: 'dash' },
        hovertemplate: `worst PM: ${corners[worst].label}<br>%{x:.3s}Hz · %{y:.1f} ${p.unit}<extra></extra>`,
      });
  return out;
}
