import { formatSi } from '@/lib/units/si';
import type { DiffKind } from '@/lib/revision-diff';

/** One value of the difference table as read: SI prefixes, degrees, dB, %. */
export function formatValue(kind: DiffKind, value: number | string | null, unit = ''): string {
  if (value === null) return '—';
  if (typeof value === 'string') return value;
  switch (kind) {
    case 'deg':
      return `${value.toFixed(1)}°`;
    case 'db':
      return `${value.toFixed(1)} dB`;
    case 'percent':
      return `${(value * 100).toFixed(1)} %`;
    case 'si':
      return formatSi(value, unit);
    default:
      return String(value);
  }
}

/**
 * A change with its sign, rounded as shown first: −0.04 at one decimal reads ±0.0, never −0.0.
 * The minus is a true minus sign (U+2212).
 */
export function signed(x: number, digits: number): string {
  const text = Math.abs(x).toFixed(digits);
  const zero = Number(text) === 0;
  return `${zero ? '±' : x > 0 ? '+' : '−'}${text}`;
}

/** The change of one margin on Compare (fc relative and absolute, PM in °, GM in dB). */
export function formatMarginDelta(d: { key: 'fc' | 'pm' | 'gm'; a: number | null; b: number | null; delta: number | null }): string {
  if (d.delta === null) return d.a === d.b ? 'no change' : 'one side has none';
  if (d.key === 'fc') {
    const abs = Math.abs(d.delta);
    const sign = signed(d.delta, 12).charAt(0);
    const pct = d.a ? ` (${signed((d.delta / d.a) * 100, 0)} %)` : '';
    return `${sign}${formatSi(abs, 'Hz')}${pct}`;
  }
  return d.key === 'pm' ? `${signed(d.delta, 1)}°` : `${signed(d.delta, 1)} dB`;
}

/** The change from a to b: absolute for degrees, dB and %, relative for SI quantities. */
export function formatChange(kind: DiffKind, a: number | string | null, b: number | string | null, unit = ''): string {
  if (typeof a !== 'number' || typeof b !== 'number') {
    if (a === null) return 'added';
    if (b === null) return 'removed';
    return `${formatValue(kind, a, unit)} → ${formatValue(kind, b, unit)}`;
  }
  switch (kind) {
    case 'deg':
      return `${signed(b - a, 1)}°`;
    case 'db':
      return `${signed(b - a, 1)} dB`;
    case 'percent':
      return `${signed((b - a) * 100, 1)} pts`;
    default:
      return a === 0 ? `${formatValue(kind, a, unit)} → ${formatValue(kind, b, unit)}` : `${signed(((b - a) / Math.abs(a)) * 100, 1)} %`;
  }
}
