'use client';

import { useId } from 'react';
import type { PlotGeometry } from '@/components/plot/bode-plot';
import { formatSi } from '@/lib/units/si';
import type { Margins } from '@/lib/engine/types';

export interface LiveCurve {
  id: string;
  color: string;
  width: number;
  magDb: number[];
  phaseDeg: number[];
}

function pathOf(f: number[], y: number[], toX: (hz: number) => number, toY: (v: number) => number): string {
  let d = '';
  for (let i = 0; i < f.length; i++) {
    const py = toY(y[i]);
    if (!Number.isFinite(py)) continue;
    d += `${d ? 'L' : 'M'}${toX(f[i]).toFixed(1)} ${py.toFixed(1)}`;
  }
  return d;
}

/**
 * The curves a drag changes, drawn as plain SVG over the plot while a handle
 * moves: Plotly redraws in about 20 ms, too slow to follow the pointer, so it
 * takes over again when the handle is let go.
 */
export function LiveCurves({ geometry: g, f, curves, margins, color }: { geometry: PlotGeometry; f: number[]; curves: LiveCurve[]; margins: Margins; color: string }) {
  const clip = useId();
  const fc = margins.crossoverHz;
  const pm = margins.phaseMarginDeg;
  const w = g.right - g.left;
  return (
    <svg className="pointer-events-none absolute inset-0" width={g.width} height={g.height} aria-hidden data-testid="live-curves">
      <defs>
        <clipPath id={`${clip}-mag`}>
          <rect x={g.left} y={g.magTop} width={w} height={g.magBottom - g.magTop} />
        </clipPath>
        <clipPath id={`${clip}-phase`}>
          <rect x={g.left} y={g.phaseTop} width={w} height={g.phaseBottom - g.phaseTop} />
        </clipPath>
      </defs>
      {curves.map((c) => (
        <g key={c.id} fill="none" stroke={c.color} strokeWidth={c.width} strokeLinejoin="round">
          <path d={pathOf(f, c.magDb, g.hzToX, g.dbToY)} clipPath={`url(#${clip}-mag)`} />
          <path d={pathOf(f, c.phaseDeg, g.hzToX, g.degToY)} clipPath={`url(#${clip}-phase)`} />
        </g>
      ))}
      {fc !== null && (
        <g stroke={color} fill={color} fontSize={11}>
          <line x1={g.hzToX(fc)} x2={g.hzToX(fc)} y1={g.magTop} y2={g.magBottom} strokeDasharray="2 3" />
          <line x1={g.hzToX(fc)} x2={g.hzToX(fc)} y1={g.phaseTop} y2={g.phaseBottom} strokeDasharray="2 3" />
          <text x={g.hzToX(fc) + 4} y={g.dbToY(0) + 14} stroke="none">
            fc {formatSi(fc, 'Hz')}
          </text>
          {pm !== null && (
            <>
              <line x1={g.hzToX(fc)} x2={g.hzToX(fc)} y1={g.degToY(-180)} y2={g.degToY(pm - 180)} strokeWidth={3} />
              <text x={g.hzToX(fc) + 4} y={g.degToY(pm - 180) - 4} stroke="none">
                PM {pm.toFixed(1)}°
              </text>
            </>
          )}
        </g>
      )}
    </svg>
  );
}
