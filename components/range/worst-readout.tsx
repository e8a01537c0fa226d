import { formatSi } from '@/lib/units/si';
import type { CornersResult } from '@/lib/engine/corners';
import type { MarginTargets } from '@/lib/engine/range';
import type { SpreadResult } from '@/lib/engine/spread';
import type { Margins } from '@/lib/engine/types';
import { formatCount } from '@/lib/format';

const fixed = (v: number) => v.toFixed(1).replace(/^-/, '−');
const deg = (v: number | null) => (v === null ? 'none' : `${fixed(v)}°`);
const db = (v: number | null) => (v === null ? 'none' : `${fixed(v)} dB`);
const hz = (v: number | null) => (v === null ? 'none' : formatSi(v, 'Hz'));

const tone = (v: number | null, target: number, floor: number) =>
  v === null ? 'text-slate-500' : v < floor ? 'text-red-700' : v < target ? 'text-amber-700' : 'text-emerald-700';

/**
 * Nominal and worst case side by side: the nominal loop, the worst corner (and where it is),
 * and the spread's 1st percentile with the share of builds that meet the targets.
 */
export function WorstReadout({ nominal, corners, spread, targets }: { nominal: Margins; corners: CornersResult | null; spread: SpreadResult | null; targets: MarginTargets }) {
  const w = corners?.worst;
  const pmCorner = w?.phaseMarginDeg.corner ?? null;
  const gmCorner = w?.gainMarginDb.corner ?? null;
  const p = spread?.percentiles;
  return (
    <div className="space-y-1" data-testid="worst-readout">
      <table className="w-full text-sm">
        <thead className="text-[11px] uppercase tracking-wide text-slate-500">
          <tr>
            <th className="py-0.5 text-left font-medium" />
            <th className="py-0.5 text-right font-medium">Nominal</th>
            <th className="py-0.5 text-right font-medium">Worst corner</th>
            <th className="py-0.5 text-right font-medium" title="1st percentile of the spread (99 % of builds do better)">Spread p1</th>
          </tr>
        </thead>
        <tbody className="num font-mono">
          <tr>
            <th className="py-0.5 text-left text-xs font-medium text-slate-600">PM</th>
            <td className={`text-right ${tone(nominal.phaseMarginDeg, targets.phaseMarginDeg, 30)}`}>{deg(nominal.phaseMarginDeg)}</td>
            <td className={`text-right font-semibold ${w ? tone(w.phaseMarginDeg.value, targets.phaseMarginDeg, 30) : ''}`} data-testid="worst-pm">
              {w ? deg(w.phaseMarginDeg.value) : '…'}
            </td>
            <td className={`text-right ${p?.phaseMarginDeg ? tone(p.phaseMarginDeg.p1, targets.phaseMarginDeg, 30) : 'text-slate-400'}`}>{p?.phaseMarginDeg ? deg(p.phaseMarginDeg.p1) : '—'}</td>
          </tr>
          <tr>
            <th className="py-0.5 text-left text-xs font-medium text-slate-600">GM</th>
            <td className={`text-right ${tone(nominal.gainMarginDb, targets.gainMarginDb, 6)}`}>{db(nominal.gainMarginDb)}</td>
            <td className={`text-right font-semibold ${w ? tone(w.gainMarginDb.value, targets.gainMarginDb, 6) : ''}`} data-testid="worst-gm">
              {w ? db(w.gainMarginDb.value) : '…'}
            </td>
            <td className={`text-right ${p?.gainMarginDb ? tone(p.gainMarginDb.p1, targets.gainMarginDb, 6) : 'text-slate-400'}`}>{p?.gainMarginDb ? db(p.gainMarginDb.p1) : '—'}</td>
          </tr>
          <tr>
            <th className="py-0.5 text-left text-xs font-medium text-slate-600">fc</th>
            <td className="text-right">{hz(nominal.crossoverHz)}</td>
            <td className="text-right text-xs">{w ? `${hz(w.crossoverHz.min)} – ${hz(w.crossoverHz.max)}` : '…'}</td>
            <td className="text-right text-xs">{p?.crossoverHz ? `${hz(p.crossoverHz.p1)} – ${hz(p.crossoverHz.p99)}` : '—'}</td>
          </tr>
        </tbody>
      </table>
      {corners && pmCorner !== null && (
        <p className="text-xs text-slate-600" data-testid="worst-where">
          Worst PM at corner {pmCorner + 1}: {corners.corners[pmCorner].label}
          {gmCorner !== null && gmCorner !== pmCorner ? `; worst GM at corner ${gmCorner + 1}: ${corners.corners[gmCorner].label}` : ''}.
        </p>
      )}
      {spread && (
        <p className="text-xs text-slate-600" data-testid="spread-share">
          {(spread.meetsTargets.share * 100).toFixed(1)} % of {formatCount(spread.samples)} simulated builds meet PM ≥ {spread.targets.phaseMarginDeg}° and GM ≥ {spread.targets.gainMarginDb} dB.
        </p>
      )}
    </div>
  );
}
