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

const signed = (x: number, digits: number) => `${x > 0 ? '+' : x < 0 ? '−' : '±'}${Math.abs(x).toFixed(digits)}`;

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

/** Dates on review screens: the shared format (fixed time zone). */
export { formatDateTime as formatDate } from '@/lib/format';
