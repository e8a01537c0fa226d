import { checkLabel } from '@/lib/catalog';
import { formatSi } from '@/lib/units/si';
import type { RangeSummary } from '@/lib/range-summary';
import { formatCount } from '@/lib/format';

type Side = { ok: true; value: RangeSummary } | { ok: false; message: string };

const fixed = (v: number) => v.toFixed(1).replace(/^-/, '−');

interface Row {
  label: string;
  a: number | null;
  b: number | null;
  text: (v: number | null) => string;
  /** Where each side's value was found (the worst corner). */
  whereA?: string | null;
  whereB?: string | null;
  /** Higher is better (margins, share); changes smaller than this read as "same". */
  epsilon: number;
}

function Change({ a, b, epsilon, unit }: { a: number | null; b: number | null; epsilon: number; unit: string }) {
  if (a === null || b === null) return <span className="text-slate-400">—</span>;
  const d = b - a;
  if (Math.abs(d) < epsilon) return <span className="text-slate-500">same</span>;
  const better = d > 0;
  return (
    <span className={better ? 'text-emerald-700' : 'text-red-700'} data-change={better ? 'better' : 'worse'}>
      {better ? '▲' : '▼'} {d > 0 ? '+' : '−'}
      {Math.abs(d).toFixed(1)}
      {unit} {better ? 'better' : 'worse'}
    </span>
  );
}

/** Risk checks raised at some corner ("subharmonic at 8 of 32, first at low line, …"), or none. */
const riskText = (s: RangeSummary) =>
  s.risks && s.risks.length > 0 ? (
    <ul className="text-red-700">
      {s.risks.map((r) => (
        <li key={r.id} title={r.message}>
          {checkLabel(r.id)}: {r.count} of {s.corners}, first at {r.corner}
        </li>
      ))}
    </ul>
  ) : (
    <span className="text-slate-500">none</span>
  );

/**
 * Both revisions' worst case across their operating ranges and their spreads, side by side, with
 * the change: a reviewer sees at a glance whether B helped the worst corner.
 */
export function RangeCompare({ a, b, labelA, labelB }: { a: Side; b: Side; labelA: string; labelB: string }) {
  if (!a.ok || !b.ok)
    return (
      <section className="card p-4 text-sm text-slate-600" aria-label="Worst case">
        <h2 className="mb-1 text-sm font-semibold text-slate-800">Worst case across the operating range</h2>
        {!a.ok && <p>{labelA}: {a.message}</p>}
        {!b.ok && <p>{labelB}: {b.message}</p>}
      </section>
    );
  const A = a.value;
  const B = b.value;
  const deg = (v: number | null) => (v === null ? 'none' : `${fixed(v)}°`);
  const db = (v: number | null) => (v === null ? 'none' : `${fixed(v)} dB`);
  const pct = (v: number | null) => (v === null ? '—' : `${(v * 100).toFixed(1)} %`);
  const rows: (Row & { unit: string })[] = [
    { label: 'Worst phase margin', a: A.worst.phaseMarginDeg.value, b: B.worst.phaseMarginDeg.value, text: deg, whereA: A.worst.phaseMarginDeg.corner, whereB: B.worst.phaseMarginDeg.corner, epsilon: 0.05, unit: '°' },
    { label: 'Worst gain margin', a: A.worst.gainMarginDb.value, b: B.worst.gainMarginDb.value, text: db, whereA: A.worst.gainMarginDb.corner, whereB: B.worst.gainMarginDb.corner, epsilon: 0.05, unit: ' dB' },
    { label: 'Spread PM, 1st percentile', a: A.spread.percentiles.phaseMarginDeg?.p1 ?? null, b: B.spread.percentiles.phaseMarginDeg?.p1 ?? null, text: deg, epsilon: 0.05, unit: '°' },
    { label: 'Spread GM, 1st percentile', a: A.spread.percentiles.gainMarginDb?.p1 ?? null, b: B.spread.percentiles.gainMarginDb?.p1 ?? null, text: db, epsilon: 0.05, unit: ' dB' },
  ];
  const shareA = A.spread.meetsTargets.share;
  const shareB = B.spread.meetsTargets.share;
  const span = (s: RangeSummary) => `${s.worst.crossoverHz.min === null ? '—' : formatSi(s.worst.crossoverHz.min, 'Hz')} – ${s.worst.crossoverHz.max === null ? '—' : formatSi(s.worst.crossoverHz.max, 'Hz')}`;
  return (
    <section className="card p-4" aria-label="Worst case" data-testid="range-compare">
      <h2 className="mb-2 text-sm font-semibold text-slate-800">Worst case across the operating range</h2>
      <table className="w-full text-sm">
        <thead className="text-left text-[11px] uppercase tracking-wide text-slate-500">
          <tr>
            <th className="py-1" />
            <th className="py-1">{labelA}</th>
            <th className="py-1">{labelB}</th>
            <th className="py-1">Change</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.label} className="border-t border-slate-100 align-top">
              <th className="py-1 pr-2 text-left font-medium text-slate-700">{r.label}</th>
              <td className="py-1 pr-2">
                <span className="num font-mono">{r.text(r.a)}</span>
                {r.whereA && <div className="text-xs text-slate-500">{r.whereA}</div>}
              </td>
              <td className="py-1 pr-2">
                <span className="num font-mono">{r.text(r.b)}</span>
                {r.whereB && <div className="text-xs text-slate-500">{r.whereB}</div>}
              </td>
              <td className="py-1 text-xs">
                <Change a={r.a} b={r.b} epsilon={r.epsilon} unit={r.unit} />
              </td>
            </tr>
          ))}
          <tr className="border-t border-slate-100">
            <th className="py-1 pr-2 text-left font-medium text-slate-700">Builds meeting the targets</th>
            <td className="num py-1 pr-2 font-mono">{pct(shareA)}</td>
            <td className="num py-1 pr-2 font-mono">{pct(shareB)}</td>
            <td className="py-1 text-xs">
              <Change a={shareA * 100} b={shareB * 100} epsilon={0.05} unit=" %" />
            </td>
          </tr>
          <tr className="border-t border-slate-100 align-top" data-testid="corner-risks">
            <th className="py-1 pr-2 text-left font-medium text-slate-700">Corners at risk</th>
            <td className="py-1 pr-2 text-xs">{riskText(A)}</td>
            <td className="py-1 pr-2 text-xs">{riskText(B)}</td>
            <td />
          </tr>
          <tr className="border-t border-slate-100">
            <th className="py-1 pr-2 text-left font-medium text-slate-700">Crossover over the corners</th>
            <td className="num py-1 pr-2 font-mono text-xs">{span(A)}</td>
            <td className="num py-1 pr-2 font-mono text-xs">{span(B)}</td>
            <td />
          </tr>
        </tbody>
      </table>
      <p className="mt-2 text-xs text-slate-500">
        {A.corners} and {B.corners} corners (compensator at nominal); spreads of {formatCount(A.spread.samples)} builds each, {A.spread.distribution}, seed {A.spread.seed}, against
        each revision&apos;s own targets ({labelA}: PM ≥ {A.targets.phaseMarginDeg}°, GM ≥ {A.targets.gainMarginDb} dB; {labelB}: PM ≥ {B.targets.phaseMarginDeg}°, GM ≥ {B.targets.gainMarginDb} dB).
      </p>
    </section>
  );
}
