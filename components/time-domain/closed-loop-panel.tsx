'use client';

import { useMemo, useState } from 'react';
import { PlotlyChart } from '@/components/plot/plotly-chart';
import type { ClosedLoopResponses } from '@/lib/engine/closed-loop';
import { formatSi } from '@/lib/units/si';
import { COLORS, freqLayout, line } from './plots';

const ohmFromDb = (db: number) => Math.pow(10, db / 20);

/** Output impedance and line-to-output, open and closed loop, with the read-outs an engineer quotes. */
export function ClosedLoopPanel({ responses, mainsHz, onMainsHz }: { responses: ClosedLoopResponses; mainsHz: 50 | 60; onMainsHz: (hz: 50 | 60) => void }) {
  const [view, setView] = useState<'zout' | 'line' | 'reference'>('zout');
  const r = responses;
  const data = useMemo(() => {
    if (view === 'zout')
      return [
        line('|Zout| open loop', r.f, r.zoutOpen.magDb.map(ohmFromDb), COLORS.open, 'dash'),
        line('|Zout/(1+T)| closed loop', r.f, r.zoutClosed.magDb.map(ohmFromDb), COLORS.closed),
      ];
    if (view === 'line')
      return [line('Gvg open loop', r.f, r.lineOpen.magDb, COLORS.open, 'dash'), line('Gvg/(1+T) closed loop', r.f, r.lineClosed.magDb, COLORS.closed)];
    return [line('vout/vref', r.f, r.reference.magDb, COLORS.reference)];
  }, [r, view]);
  const layout = useMemo(() => {
    const base = freqLayout(view === 'zout' ? 'Output impedance (Ω)' : 'Gain (dB)');
    if (view === 'zout') base.yaxis = { ...base.yaxis, type: 'log', exponentformat: 'SI' };
    return base;
  }, [view]);
  const tab = (id: typeof view, label: string) => (
    <button type="button" role="tab" aria-selected={view === id} className={`rounded px-2 py-1 text-xs ${view === id ? 'bg-indigo-600 text-white' : 'text-slate-600 hover:bg-slate-100'}`} onClick={() => setView(id)}>
      {label}
    </button>
  );
  return (
    <div className="space-y-3" data-testid="closed-loop-panel">
      <div role="tablist" aria-label="Closed-loop response" className="flex gap-1">
        {tab('zout', 'Output impedance')}
        {tab('line', 'Line to output')}
        {tab('reference', 'Reference to output')}
      </div>
      <PlotlyChart data={data} layout={layout} className="h-[300px]" data-testid="closed-loop-plot" aria-label="Closed-loop response plot" />
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-3" data-testid="closed-loop-readouts">
        <div>
          <dt className="text-slate-500">Peak closed-loop |Zout|</dt>
          <dd className="num font-mono">
            {formatSi(r.zoutClosedPeakOhm, 'Ω')} at {formatSi(r.zoutClosedPeakHz, 'Hz')}
          </dd>
        </div>
        <div>
          <dt className="text-slate-500">Line ripple at fsw</dt>
          <dd className="num font-mono" title="Beyond fsw/2 the averaged model is only an estimate">
            {r.lineRejectionAtFswDb.toFixed(1).replace('-', '−')} dB
          </dd>
        </div>
        <div>
          <dt className="text-slate-500">
            Line ripple at 2 × mains{' '}
            <select aria-label="Mains frequency" className="ml-1 rounded border border-slate-300 px-1 text-xs" value={mainsHz} onChange={(e) => onMainsHz(e.target.value === '60' ? 60 : 50)}>
              <option value={50}>50 Hz</option>
              <option value={60}>60 Hz</option>
            </select>
          </dt>
          <dd className="num font-mono">
            {r.lineRejectionAtMainsDb.toFixed(1).replace('-', '−')} dB at {r.mainsRippleHz} Hz
          </dd>
        </div>
      </dl>
    </div>
  );
}
