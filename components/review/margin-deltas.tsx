import type { MarginDelta } from '@/lib/revision-diff';
import { formatSi } from '@/lib/units/si';

function show(key: MarginDelta['key'], v: number | null) {
  if (v === null) return '—';
  return key === 'fc' ? formatSi(v, 'Hz') : key === 'pm' ? `${v.toFixed(1)}°` : `${v.toFixed(1)} dB`;
}

function showDelta(d: MarginDelta) {
  if (d.delta === null) return d.a === d.b ? 'no change' : 'one side has none';
  const sign = d.delta > 0 ? '+' : d.delta < 0 ? '−' : '±';
  const abs = Math.abs(d.delta);
  if (d.key === 'fc') {
    const pct = d.a ? ` (${sign}${((abs / d.a) * 100).toFixed(0)} %)` : '';
    return `${sign}${formatSi(abs, 'Hz')}${pct}`;
  }
  return `${sign}${abs.toFixed(1)}${d.key === 'pm' ? '°' : ' dB'}`;
}

/** fc, PM and GM of A → B with the change; margins green when they grow, red when they shrink. */
export function MarginDeltas({ deltas, labelA, labelB }: { deltas: MarginDelta[]; labelA: string; labelB: string }) {
  return (
    <div className="grid gap-3 sm:grid-cols-3" data-testid="margin-deltas">
      {deltas.map((d) => {
        const tone =
          d.delta === null || Math.abs(d.delta) < 1e-9 || d.key === 'fc'
            ? 'text-slate-700'
            : d.delta > 0
              ? 'text-emerald-700'
              : 'text-rose-700';
        return (
          <div key={d.key} className="card px-4 py-3" data-margin={d.key}>
            <div className="text-xs font-medium uppercase tracking-wide text-slate-500">{d.label}</div>
            <div className="num mt-1 text-sm text-slate-600">
              {labelA} {show(d.key, d.a)} → {labelB} <span className="font-semibold text-slate-900">{show(d.key, d.b)}</span>
            </div>
            <div className={`num mt-1 text-xl font-semibold ${tone}`}>{showDelta(d)}</div>
          </div>
        );
      })}
    </div>
  );
}
