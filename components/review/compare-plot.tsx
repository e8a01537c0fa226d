'use client';

import { useMemo, useState } from 'react';
import { BodePlot, type BodeSeries, type MarginMarks } from '@/components/plot/bode-plot';
import { COMPARE_COLORS } from '@/lib/catalog/traces';
import type { BodeData, Margins } from '@/lib/engine/types';

export interface CompareLoop {
  label: string;
  bode: BodeData;
  margins: Margins;
}

// A is the reference (older) and drawn in a muted dashed line, B in the loop colour, solid.
const STYLE = COMPARE_COLORS;

/** Both loop gains on one Bode plot, with each one's fc, PM and GM marked. */
export function ComparePlot({ a, b }: { a: CompareLoop; b: CompareLoop }) {
  const [parts, setParts] = useState(false);
  const series = useMemo<BodeSeries[]>(() => {
    const out: BodeSeries[] = [];
    for (const [side, loop] of [['a', a], ['b', b]] as const) {
      const s = STYLE[side];
      const common = { f: loop.bode.f, dash: s.dash, width: s.width };
      out.push({ id: `${side}-loop`, name: `${loop.label} loop gain`, color: s.loop, magDb: loop.bode.loop.magDb, phaseDeg: loop.bode.loop.phaseDeg, ...common });
      out.push(
        { id: `${side}-plant`, name: `${loop.label} power stage`, color: s.plant, magDb: loop.bode.plant.magDb, phaseDeg: loop.bode.plant.phaseDeg, visible: parts, ...common, width: 1.5 },
        { id: `${side}-comp`, name: `${loop.label} compensator`, color: s.compensator, magDb: loop.bode.compensator.magDb, phaseDeg: loop.bode.compensator.phaseDeg, visible: parts, ...common, width: 1.5 },
      );
    }
    return out;
  }, [a, b, parts]);
  const margins = useMemo<MarginMarks[]>(
    () => [
      { ...a.margins, color: STYLE.a.loop, label: a.label },
      { ...b.margins, color: STYLE.b.loop, label: b.label },
    ],
    [a, b],
  );
  return (
    <div className="card p-3">
      <div className="mb-2 flex flex-wrap items-center gap-4 text-sm">
        <span className="flex items-center gap-2">
          <svg width="28" height="6" aria-hidden="true">
            <line x1="0" y1="3" x2="28" y2="3" stroke={STYLE.a.loop} strokeWidth="2" strokeDasharray="6 4" />
          </svg>
          {a.label} (A)
        </span>
        <span className="flex items-center gap-2">
          <svg width="28" height="6" aria-hidden="true">
            <line x1="0" y1="3" x2="28" y2="3" stroke={STYLE.b.loop} strokeWidth="3" />
          </svg>
          {b.label} (B)
        </span>
        <label className="ml-auto flex items-center gap-2 text-slate-600">
          <input type="checkbox" className="accent-indigo-600" checked={parts} onChange={(e) => setParts(e.target.checked)} />
          Also show power stage and compensator
        </label>
      </div>
      <BodePlot f={b.bode.f} series={series} margins={margins} height={480} showLegend={false} aria-label={`Bode plot of ${a.label} and ${b.label}`} />
    </div>
  );
}
