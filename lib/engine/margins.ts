/**
 * Stability margins of a loop gain T from a sampled Bode response, with crossings refined
 * numerically on the analytic function when one is given.
 *
 * Definitions (the usual ones, e.g. Ogata, Modern Control Engineering, 5th ed., §7-6):
 * - every 0 dB crossing of |T| and every −180° crossing of the unwrapped phase is listed;
 * - headline crossover fc = the highest frequency where |T| falls through 0 dB;
 * - phase margin = 180° + ∠T(j2πfc), phase unwrapped continuously from its principal value
 *   at the low end of the sweep;
 * - gain margin = −|T|dB at the first downward −180° crossing above fc inside the sweep
 *   (without fc: the first downward −180° crossing of the sweep); null when there is none.
 * Without an analytic function (e.g. measured bench data), crossings are interpolated
 * linearly in log f.
 */
import { dbFromMagSq } from './transfer';
import type { Crossing, Margins } from './types';

/** A sampled response: frequencies (Hz, ascending), magnitude (dB), unwrapped phase (deg). */
export interface SampledResponse {
  f: ArrayLike<number>;
  magDb: ArrayLike<number>;
  phaseDeg: ArrayLike<number>;
}

/**
 * The analytic loop at one frequency: magnitude in dB, phase in degrees on the sweep's branch.
 * It may carry magnitude-only and phase-only forms of the same arithmetic (sweep.ts does): a
 * gain crossing is refined without arctangents, a phase crossing without logarithms.
 */
export type LoopPointEvaluator = ((hz: number) => { magDb: number; phaseDeg: number }) & {
  magDbAt?: (hz: number) => number;
  phaseDegAt?: (hz: number) => number;
};

const magnitudeOf = (evaluate: LoopPointEvaluator) => evaluate.magDbAt ?? ((hz: number) => evaluate(hz).magDb);
const phaseOfEvaluator = (evaluate: LoopPointEvaluator) => evaluate.phaseDegAt ?? ((hz: number) => evaluate(hz).phaseDeg);

/**
 * Unwrap a phase sequence (degrees): each step is moved by a multiple of 360° so it differs
 * from the previous sample by at most 180°. The first sample keeps its value.
 */
export const unwrapPhase = (phaseDeg: ArrayLike<number>): number[] => {
  const out = new Array<number>(phaseDeg.length);
  if (phaseDeg.length === 0) return out;
  out[0] = phaseDeg[0];
  let shift = 0;
  for (let i = 1; i < phaseDeg.length; i++) {
    const step = phaseDeg[i] - phaseDeg[i - 1];
    shift -= 360 * Math.round(step / 360);
    out[i] = phaseDeg[i] + shift;
  }
  return out;
};

/**
 * Root of g on [xa, xb] (g(xa) ≥ 0 > g(xb) or the reverse) by the Illinois variant of
 * regula falsi; x is ln f. Converges superlinearly; stops at |g| ≤ 1e-12 (dB or degrees)
 * or when the bracket is down to rounding.
 */
const refineRoot = (g: (x: number) => number, xa: number, xb: number, ga: number, gb: number): number => {
  let side = 0;
  for (let iter = 0; iter < 100; iter++) {
    const x = (xa * gb - xb * ga) / (gb - ga);
    const gx = g(x);
    if (Math.abs(gx) <= 1e-12 || Math.abs(xb - xa) < 1e-15 * Math.max(1, Math.abs(x))) return x;
    if (gx >= 0 === ga >= 0) {
      xa = x;
      ga = gx;
      if (side === -1) gb /= 2;
      side = -1;
    } else {
      xb = x;
      gb = gx;
      if (side === 1) ga /= 2;
      side = 1;
    }
  }
  return (xa * gb - xb * ga) / (gb - ga);
};

type FoundCrossing = { hz: number; direction: 'down' | 'up' };

/** One crossing of `level` between fa and fb, where y − level is ga at fa and gb at fb. */
const crossingBetween = (
  fa: number,
  fb: number,
  ga: number,
  gb: number,
  level: number,
  exact?: (hz: number) => number,
): FoundCrossing => {
  const xa = Math.log(fa);
  const xb = Math.log(fb);
  let x: number;
  if (ga === 0) x = xa;
  else if (exact) x = refineRoot((xx) => exact(Math.exp(xx)) - level, xa, xb, ga, gb);
  else x = xa + ((xb - xa) * ga) / (ga - gb);
  return { hz: Math.exp(x), direction: ga >= 0 ? 'down' : 'up' };
};

/**
 * Crossings of a sampled curve y(f) through `level`. A crossing lies between samples i and
 * i+1 when (y_i ≥ level) ≠ (y_{i+1} ≥ level); direction "down" when y falls through it.
 * With `exact` (the analytic y at any frequency) each crossing is refined numerically in
 * ln f; otherwise it is interpolated linearly in ln f.
 */
export const findCrossings = (
  f: ArrayLike<number>,
  y: ArrayLike<number>,
  level: number,
  exact?: (hz: number) => number,
): FoundCrossing[] => {
  const out: FoundCrossing[] = [];
  const n = f.length;
  let ga = n > 0 ? y[0] - level : 0;
  for (let i = 0; i + 1 < n; i++) {
    const gb = y[i + 1] - level;
    if (ga >= 0 !== gb >= 0) out.push(crossingBetween(f[i], f[i + 1], ga, gb, level, exact));
    ga = gb;
  }
  return out;
};

/** Linear interpolation of y at `hz` in ln f on a sampled curve (clamped at the ends). */
export const interpolateLogF = (f: ArrayLike<number>, y: ArrayLike<number>, hz: number): number => {
  const n = f.length;
  if (hz <= f[0]) return y[0];
  if (hz >= f[n - 1]) return y[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (f[mid] <= hz) lo = mid;
    else hi = mid;
  }
  const t = Math.log(hz / f[lo]) / Math.log(f[hi] / f[lo]);
  return y[lo] + t * (y[hi] - y[lo]);
};

/**
 * Margins from the listed crossings (definitions in the module header); each list ascends in
 * frequency. `phaseAt` and `magDbAt` read the loop at the crossover and the phase crossover.
 */
const assembleMargins = (
  gain: FoundCrossing[],
  phase: FoundCrossing[],
  phaseAt: (hz: number) => number,
  magDbAt: (hz: number) => number,
): Margins => {
  // The two ascending lists merged, a gain crossing before a phase one at the same frequency.
  const crossings: Crossing[] = [];
  for (let a = 0, b = 0; a < gain.length || b < phase.length; ) {
    if (b >= phase.length || (a < gain.length && gain[a].hz <= phase[b].hz)) crossings.push({ kind: 'gain', hz: gain[a].hz, direction: gain[a++].direction });
    else crossings.push({ kind: 'phase', hz: phase[b].hz, direction: phase[b++].direction });
  }
  let crossoverHz: number | null = null;
  for (const c of gain) if (c.direction === 'down' && (crossoverHz === null || c.hz > crossoverHz)) crossoverHz = c.hz;
  const phaseMarginDeg = crossoverHz === null ? null : 180 + phaseAt(crossoverHz);
  let phaseCrossoverHz: number | null = null;
  for (const c of phase) {
    if (c.direction === 'down' && (crossoverHz === null || c.hz > crossoverHz)) {
      phaseCrossoverHz = c.hz;
      break;
    }
  }
  const gainMarginDb = phaseCrossoverHz === null ? null : -magDbAt(phaseCrossoverHz);
  return { crossoverHz, phaseMarginDeg, gainMarginDb, phaseCrossoverHz, crossings };
};

/**
 * Margins of a loop from its sampled response (see the module header for the definitions).
 * @param sampled the sweep (phase already continuous, starting at its principal value)
 * @param evaluate the same loop as an analytic function; crossings are then exact
 *   (|T(fc)| = 1 to ~1e-12 dB) instead of interpolated.
 */
export const computeMargins = (sampled: SampledResponse, evaluate?: LoopPointEvaluator): Margins => {
  const { magDb, phaseDeg } = sampled;
  const at: TraceCrossings = { gainAt: [], phaseAt: [] };
  const n = sampled.f.length;
  let ma = n > 0 ? magDb[0] : 0;
  let pa = n > 0 ? phaseDeg[0] + 180 : 0;
  for (let i = 0; i + 1 < n; i++) {
    const mb = magDb[i + 1];
    const pb = phaseDeg[i + 1] + 180;
    if (ma >= 0 !== mb >= 0) at.gainAt.push(i);
    if (pa >= 0 !== pb >= 0) at.phaseAt.push(i);
    ma = mb;
    pa = pb;
  }
  return marginsFromCrossings(sampled, at, evaluate);
};

/**
 * The intervals i (between samples i and i+1) of a sampled loop where the magnitude passes
 * 0 dB, (magDb ≥ 0) changing, and where the phase passes −180°, (phaseDeg ≥ −180) changing:
 * what computeMargins looks for, found by whoever makes the samples (analyze.ts does it
 * while it adds the plant and compensator traces, one pass fewer).
 */
export interface TraceCrossings {
  gainAt: number[];
  phaseAt: number[];
}

/** computeMargins with the crossing intervals already found (see TraceCrossings). */
export const marginsFromCrossings = (sampled: SampledResponse, at: TraceCrossings, evaluate?: LoopPointEvaluator): Margins => {
  const { f, magDb, phaseDeg } = sampled;
  const magOf = evaluate && magnitudeOf(evaluate);
  const phaseOf = evaluate && phaseOfEvaluator(evaluate);
  const gain: FoundCrossing[] = [];
  const phase: FoundCrossing[] = [];
  for (const i of at.gainAt) gain.push(crossingBetween(f[i], f[i + 1], magDb[i], magDb[i + 1], 0, magOf));
  for (const i of at.phaseAt) phase.push(crossingBetween(f[i], f[i + 1], phaseDeg[i] + 180, phaseDeg[i + 1] + 180, -180, phaseOf));
  return assembleMargins(gain, phase, phaseOf ?? ((hz) => interpolateLogF(f, phaseDeg, hz)), magOf ?? ((hz) => interpolateLogF(f, magDb, hz)));
};

/**
 * Where a loop's samples on a grid may cross the margins' levels: the intervals i (between
 * f_i and f_{i+1}) where |T|² passes 1, with |T|² at both ends, and the intervals where
 * Im T changes sign (T passes the real axis: the candidates for a −180° crossing).
 */
export interface LoopScan {
  gainAt: number[];
  /** |T|² at the two ends of each gainAt interval, flat: [m_i, m_{i+1}, …]. */
  gainMagSq: number[];
  phaseAt: number[];
}

/**
 * Margins from a scan (see LoopScan): each gain interval is refined on `evaluate`; each
 * phase candidate is kept when the continuous phase of `evaluate` passes −180° between its
 * two samples, then refined. The same crossings {@link computeMargins} finds on the same grid.
 */
export const marginsFromScan = (f: ArrayLike<number>, scan: LoopScan, evaluate: LoopPointEvaluator): Margins => {
  const gain: FoundCrossing[] = [];
  const phase: FoundCrossing[] = [];
  const magOf = magnitudeOf(evaluate);
  const phaseOf = phaseOfEvaluator(evaluate);
  for (let k = 0; k < scan.gainAt.length; k++) {
    const i = scan.gainAt[k];
    gain.push(crossingBetween(f[i], f[i + 1], dbFromMagSq(scan.gainMagSq[2 * k]), dbFromMagSq(scan.gainMagSq[2 * k + 1]), 0, magOf));
  }
  // Adjacent candidates share a sample: its phase is evaluated once.
  let last = -2;
  let lastPb = 0;
  for (const i of scan.phaseAt) {
    const pa = i === last + 1 ? lastPb : phaseOf(f[i]) + 180;
    const pb = phaseOf(f[i + 1]) + 180;
    last = i;
    lastPb = pb;
    if (pa >= 0 !== pb >= 0) phase.push(crossingBetween(f[i], f[i + 1], pa, pb, -180, phaseOf));
  }
  return assembleMargins(gain, phase, phaseOf, magOf);
};

/**
 * The same margins from complex samples T(j2πf) = re + j·im, without a logarithm or an
 * arctangent per sample: gain crossings where |T|² passes 1, candidate phase crossings where
 * Im T changes sign; then as {@link marginsFromScan}. The engine scans its loops without
 * forming the samples (sweep.ts, scanTransfer); this form serves sampled complex data and
 * checks that scan.
 */
export const computeMarginsFromComplex = (
  f: ArrayLike<number>,
  re: ArrayLike<number>,
  im: ArrayLike<number>,
  evaluate: LoopPointEvaluator,
): Margins => {
  const scan: LoopScan = { gainAt: [], gainMagSq: [], phaseAt: [] };
  let m0 = re[0] * re[0] + im[0] * im[0];
  for (let i = 0; i + 1 < f.length; i++) {
    const m1 = re[i + 1] * re[i + 1] + im[i + 1] * im[i + 1];
    if (m0 >= 1 !== m1 >= 1) scan.gainAt.push(i), scan.gainMagSq.push(m0, m1);
    if (im[i] >= 0 !== im[i + 1] >= 0) scan.phaseAt.push(i);
    m0 = m1;
  }
  return marginsFromScan(f, scan, evaluate);
};
