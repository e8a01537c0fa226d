/**
 * Preferred values per IEC 60063:2015.
 * E6–E24 are the standard's two-digit tables, hard-coded (they differ from the rounded
 * geometric series at eight E24 entries). E48–E192 are round(10^(k/N), 2 decimals), with
 * the one published exception E192 k = 185: 9.20 instead of the formula's 9.19.
 */
import type { ESeriesName } from './types';

const E6 = [1.0, 1.5, 2.2, 3.3, 4.7, 6.8];
const E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];
const E24 = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2,
  9.1,
];

const geometric = (n: number): number[] =>
  Array.from({ length: n }, (_, k) => {
    if (n === 192 && k === 185) return 9.2;
    return Math.round(Math.pow(10, k / n) * 100) / 100;
  });

const TABLES: Record<ESeriesName, readonly number[]> = {
  E6,
  E12,
  E24,
  E48: geometric(48),
  E96: geometric(96),
  E192: geometric(192),
};

/**
 * Tolerance (fraction) each series was designed for: IEC 60063 spaces a series so that adjacent
 * values' tolerance bands meet — E6 ±20 %, E12 ±10 %, E24 ±5 %, E48 ±2 %, E96 ±1 %, E192 ±0.5 %.
 * Read by the operating range (default part tolerances) and the parts list.
 */
export const SERIES_TOLERANCE: Readonly<Record<ESeriesName, number>> = {
  E6: 0.2,
  E12: 0.1,
  E24: 0.05,
  E48: 0.02,
  E96: 0.01,
  E192: 0.005,
};

/** Mantissas of a series in [1, 10), ascending. */
export const seriesValues = (series: ESeriesName): readonly number[] => TABLES[series];

/** log10 of each mantissa, with the next decade's 1.0 appended (log 1) for the wrap-around. */
const LOG_TABLES: Record<ESeriesName, Float64Array> = Object.fromEntries(
  (Object.keys(TABLES) as ESeriesName[]).map((k) => [k, Float64Array.from([...TABLES[k], 10], Math.log10)]),
) as Record<ESeriesName, Float64Array>;

/**
 * Nearest preferred value to `value` in log distance |log(value/candidate)|, across decade
 * boundaries (e.g. 9.7 snaps to 10 in E12). Non-positive or non-finite input is returned as is.
 */
export const snapToSeries = (value: number, series: ESeriesName): number => {
  if (!(value > 0) || !Number.isFinite(value)) return value;
  const table = TABLES[series];
  const logs = LOG_TABLES[series];
  const x = Math.log10(value);
  let decade = Math.floor(x);
  const frac = x - decade; // in [0, 1)
  // logs is ascending from 0 to 1 (the appended 10): the nearest is one of the two around frac.
  // The first entry above frac, by bisection (E192 has 193 entries; this runs per part per sample).
  let lo = 0;
  let hi = logs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (logs[mid] <= frac) lo = mid;
    else hi = mid;
  }
  let idx = frac - logs[hi - 1] <= logs[hi] - frac ? hi - 1 : hi;
  if (idx === table.length) {
    idx = 0;
    decade += 1;
  }
  // Mantissas have two decimals: scale an exact integer by an exact power of ten, so the
  // result is the double nearest the decimal value (4.7e-6, not 4.699999…e-6).
  const hundredths = Math.round(table[idx] * 100);
  const p = decade - 2;
  return p >= 0 ? hundredths * Math.pow(10, p) : hundredths / Math.pow(10, -p);
};
