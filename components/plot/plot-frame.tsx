'use client';

import type { PlotGeometry } from './geometry';
import { GRID, GUIDE, frequencyTicks } from './bode-traces';

const steps = (lo: number, hi: number, step: number) => {
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9; v += step) out.push(v);
  return out;
};

/**
 * The Bode plot's axes, grid and tick labels in plain SVG, laid out as buildBodeLayout lays them
 * out for Plotly (same margins, ranges, ticks), so curves drawn over it before Plotly has loaded
 * sit where Plotly then draws them.
 */
export function PlotFrame({ geometry: g }: { geometry: PlotGeometry }) {
  const { tickvals, ticktext } = frequencyTicks(g.ranges);
  const [m0, m1] = g.ranges.mag;
  const [p0, p1] = g.ranges.phase;
  const magTicks = steps(m0, m1, m1 - m0 > 160 ? 40 : 20);
  const phaseTicks = steps(p0, p1, p1 - p0 > 360 ? 90 : 45);
  const panels = [
    { top: g.magTop, bottom: g.magBottom, ticks: magTicks, toY: g.dbToY, suffix: ' dB', title: 'Magnitude' },
    { top: g.phaseTop, bottom: g.phaseBottom, ticks: phaseTicks, toY: g.degToY, suffix: '°', title: 'Phase' },
  ];
  return (
    <svg className="pointer-events-none absolute inset-0 bg-white" width={g.width} height={g.height} aria-hidden data-testid="plot-frame" fontFamily="Inter Variable, system-ui, sans-serif" fontSize={12} fill="#334155">
      {panels.map((p) => (
        <g key={p.title}>
          <g stroke={GRID} strokeWidth={1}>
            {tickvals.map((v) => (
              <line key={v} x1={g.hzToX(v)} x2={g.hzToX(v)} y1={p.top} y2={p.bottom} />
            ))}
            {p.ticks.map((v) => (
              <line key={v} x1={g.left} x2={g.right} y1={p.toY(v)} y2={p.toY(v)} />
            ))}
          </g>
          {p.ticks.map((v) => (
            <text key={v} x={g.left - 4} y={p.toY(v) + 4} textAnchor="end">
              {v < 0 ? `−${-v}` : v}
              {p.suffix}
            </text>
          ))}
          <text fontSize={11} transform={`translate(${g.left - 56} ${(p.top + p.bottom) / 2}) rotate(-90)`} textAnchor="middle">
            {p.title}
          </text>
        </g>
      ))}
      <g stroke={GUIDE} strokeDasharray="4 4">
        <line x1={g.left} x2={g.right} y1={g.dbToY(0)} y2={g.dbToY(0)} />
        <line x1={g.left} x2={g.right} y1={g.degToY(-180)} y2={g.degToY(-180)} />
      </g>
      {tickvals.map((v, i) =>
        ticktext[i] ? (
          <text key={v} x={g.hzToX(v)} y={g.phaseBottom + 13} textAnchor="middle">
            {ticktext[i]}
          </text>
        ) : null,
      )}
      <text fontSize={11} x={(g.left + g.right) / 2} y={g.phaseBottom + 28} textAnchor="middle">
        Frequency
      </text>
    </svg>
  );
}
