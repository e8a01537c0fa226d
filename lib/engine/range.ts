/**
 * The operating range of a design: the line and load it must regulate over and the
 * tolerances of its parts. Corners (corners.ts) take every combination of the extremes;
 * the spread (spread.ts) draws parts at random within their tolerances.
 *
 * Tolerances are fractions (0.2 = ±20 %). The ESR is a min/max pair in Ω rather than a
 * tolerance: an electrolytic's ESR moves several-fold between hot and cold.
 */
import { RANGE_QUANTITIES } from '@/lib/catalog/range-inputs';
import { SERIES_TOLERANCE } from './eseries';
import type { ConverterInput, FieldIssue, PartsOptions } from './types';

export interface Interval {
  min: number;
  max: number;
}

export interface OperatingRange {
  vin: Interval;
  iout: Interval;
  l: { tol: number };
  c: { tol: number };
  /** Capacitor ESR, Ω. */
  rc: Interval;
  /** Compensator parts' tolerances; absent: each series' own (SERIES_TOLERANCE, eseries.ts). */
  parts?: { resistorTol: number; capacitorTol: number };
}

export const DEFAULT_PARTS_SERIES: PartsOptions = { resistorSeries: 'E96', capacitorSeries: 'E12' };

/** Compensator tolerances: the range's own, or those of the parts' series. */
export const partsTolerances = (range: OperatingRange, parts?: Partial<PartsOptions>) => {
  if (range.parts) return range.parts;
  const s = { ...DEFAULT_PARTS_SERIES, ...parts };
  return { resistorTol: SERIES_TOLERANCE[s.resistorSeries], capacitorTol: SERIES_TOLERANCE[s.capacitorSeries] };
};

/**
 * A starting range for a new design (common practice, to be edited): line ±10 %, load from a
 * tenth of full load to full load, L ±20 % (typical power inductors), C ±20 %, ESR from half to
 * twice its nominal value (hot and cold), compensator parts at their series' tolerance. For a
 * buck the low line stays above vout; for a boost the high line stays below it.
 */
export const defaultRange = (cv: ConverterInput): OperatingRange => {
  let vinMin = cv.vin * 0.9;
  let vinMax = cv.vin * 1.1;
  if (cv.topology === 'buck' && vinMin <= cv.vout * 1.05) vinMin = Math.min(cv.vin, cv.vout * 1.05);
  if (cv.topology === 'boost' && vinMax >= cv.vout * 0.95) vinMax = Math.max(cv.vin, cv.vout * 0.95);
  const rc = cv.rc ?? 0;
  return {
    vin: { min: round3(vinMin), max: round3(vinMax) },
    iout: { min: round3(cv.iout * 0.1), max: cv.iout },
    l: { tol: 0.2 },
    c: { tol: 0.2 },
    rc: { min: round3(rc * 0.5), max: round3(rc * 2) },
  };
};

/** Three significant digits, so defaults read as values a person would type. */
const round3 = (v: number) => (v === 0 ? 0 : Number(v.toPrecision(3)));

/** Problems of a range (paths under `range.`): positive line and load, min ≤ max, 0 ≤ tol < 1. */
export const rangeIssues = (range: OperatingRange, prefix = 'range'): FieldIssue[] => {
  const issues: FieldIssue[] = [];
  const interval = (key: 'vin' | 'iout' | 'rc', what: string, unit: string, allowZero: boolean) => {
    const { min, max } = range[key];
    if (!(Number.isFinite(min) && (allowZero ? min >= 0 : min > 0)))
      issues.push({ path: `${prefix}.${key}.min`, message: `${what} minimum must be ${allowZero ? '0 or more' : 'above 0'} ${unit}` });
    if (!(Number.isFinite(max) && max >= min))
      issues.push({ path: `${prefix}.${key}.max`, message: `${what} maximum must be at least its minimum (${min} ${unit})` });
  };
  const q = RANGE_QUANTITIES;
  interval('vin', q.vin.label, q.vin.unit, false);
  interval('iout', q.iout.label, q.iout.unit, false);
  interval('rc', q.rc.label, q.rc.unit, true);
  const tol = (path: string, v: number, what: string) => {
    if (!(Number.isFinite(v) && v >= 0 && v < 1)) issues.push({ path: `${prefix}.${path}`, message: `${what} tolerance must be from 0 to under 100 %` });
  };
  tol('l.tol', range.l.tol, q.l.label);
  tol('c.tol', range.c.tol, q.c.label);
  if (range.parts) {
    tol('parts.resistorTol', range.parts.resistorTol, q.resistorTol.label);
    tol('parts.capacitorTol', range.parts.capacitorTol, q.capacitorTol.label);
  }
  return issues;
};

/** The values a corner sets on the power stage. */
export interface CornerValues {
  vin: number;
  iout: number;
  l: number;
  c: number;
  rc: number;
}

/** Distinct extremes of an interval (one value when min = max). */
const extremes = (min: number, max: number): number[] => (min === max ? [min] : [min, max]);

/**
 * Every combination of the range's extremes around the nominal stage, in a fixed order
 * (vin slowest, then iout, L, C, ESR). An axis with no spread contributes one value, so a
 * range of zero width gives one corner. L and C are the nominal values times (1 ± tol).
 */
export const enumerateCorners = (cv: ConverterInput, range: OperatingRange): CornerValues[] => {
  const out: CornerValues[] = [];
  for (const vin of extremes(range.vin.min, range.vin.max))
    for (const iout of extremes(range.iout.min, range.iout.max))
      for (const l of extremes(cv.l * (1 - range.l.tol), cv.l * (1 + range.l.tol)))
        for (const c of extremes(cv.c * (1 - range.c.tol), cv.c * (1 + range.c.tol)))
          for (const rc of extremes(range.rc.min, range.rc.max)) out.push({ vin, iout, l, c, rc });
  return out;
};

/** The stage at a corner: the nominal stage with the corner's five values. */
export const stageAtCorner = (cv: ConverterInput, k: CornerValues): ConverterInput => ({ ...cv, ...k });

/**
 * A corner in words, for checks and the report: "low line, full load, L −20 %, C −20 %, ESR
 * high". Each axis is named only when the range spreads it.
 */
export const describeCorner = (cv: ConverterInput, range: OperatingRange, k: CornerValues): string => {
  const words: string[] = [];
  const side = (v: number, lo: number, hi: number) => (lo === hi ? null : v === lo ? 'lo' : v === hi ? 'hi' : null);
  const pct = (v: number, nominal: number) => {
    const p = Math.round((v / nominal - 1) * 1000) / 10;
    return `${p > 0 ? '+' : p < 0 ? '−' : '±'}${Math.abs(p)} %`;
  };
  const vin = side(k.vin, range.vin.min, range.vin.max);
  if (vin) words.push(vin === 'lo' ? 'low line' : 'high line');
  const iout = side(k.iout, range.iout.min, range.iout.max);
  if (iout) words.push(iout === 'lo' ? 'light load' : 'full load');
  if (range.l.tol > 0) words.push(`L ${pct(k.l, cv.l)}`);
  if (range.c.tol > 0) words.push(`C ${pct(k.c, cv.c)}`);
  const rc = side(k.rc, range.rc.min, range.rc.max);
  if (rc) words.push(rc === 'lo' ? 'ESR low' : 'ESR high');
  return words.length > 0 ? words.join(', ') : 'nominal';
};

/** Margin targets a design is judged against (the spread's share, the worst-case checks). */
export interface MarginTargets {
  phaseMarginDeg: number;
  gainMarginDb: number;
}

/** PM ≥ 45°, GM ≥ 10 dB (common practice). */
export const DEFAULT_TARGETS: MarginTargets = { phaseMarginDeg: 45, gainMarginDb: 10 };

/**
 * What a revision stores beside the analysis request: its operating range and margin
 * targets. Both optional, so revisions saved before ranges existed keep loading.
 */
export interface RangeFields {
  range?: OperatingRange;
  targets?: MarginTargets;
}

/** The stored range, or the defaults for the design's stage. */
export const rangeOf = (input: { converter: ConverterInput } & RangeFields): OperatingRange => input.range ?? defaultRange(input.converter);

export const targetsOf = (input: RangeFields): MarginTargets => input.targets ?? DEFAULT_TARGETS;

/** The input with its range and targets written out (defaults filled), as a revision saves it. */
export const withRange = <T extends { converter: ConverterInput } & RangeFields>(input: T): T & Required<RangeFields> => ({
  ...input,
  range: rangeOf(input),
  targets: targetsOf(input),
});
