import type { MarginDelta } from '@/lib/revision-diff';
import { formatSi } from '@/lib/units/si';
import { formatMarginDelta } from './format';

function show(key: MarginDelta['key'], v: number | null) {
  if (v === null) return '—';
  return key === 'fc' ? formatSi(v, 'Hz') : key === 'pm' ? `${v.toFixed(1)}°` : `${v.toFixed(1)} dB`;
}

/** fc, PM and GM of A → B with the change; margins green when they grow, red when they shrink. */
export function MarginDeltas({ deltas, labelA, labelB }: { deltas: MarginDelta[]; labelA: string; labelB: string }) {
  return (
    <div className="grid gap-3 sm:grid-cols-3" data-testid="margin-deltas">
      {deltas.map((d) => {
        const tone =
          d.delta === null || Math.abs(d.delta) < 0.05 || d.key === 'fc'
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
            <div className={`num mt-1 text-xl font-semibold ${tone}`}>{formatMarginDelta(d)}</div>
          </div>
        );
      })}
    </div>
  );
}
