/**
 * Stability margins of a loop gain T from a sampled Bode response, with crossings refined
 * numerically on the analytic function when one is given.
 *
 * Definitions (issue 3, item 7):
 * - every 0 dB crossing of |T| and every −180° crossing of the unwrapped phase is listed;
 * - headline crossover fc = the highest frequency where |T| falls through 0 dB;
 * - phase margin = 180° + ∠T(j2πfc), phase unwrapped continuously from its principal value
 *   at the low end of the sweep;
 * - gain margin = −|T|dB at the first downward −180° crossing above fc inside the sweep
 *   (without fc: the first downward −180° crossing of the sweep); null when there is none.
 * Without an analytic function (e.g. measured bench data), crossings are interpolated
 * linearly in log f.
 */
import type { Crossing, Margins } from './types';

/** A sampled response: frequencies (Hz, ascending), magnitude (dB), unwrapped phase (deg). */
export interface SampledResponse {
  f: ArrayLike<number>;
  magDb: ArrayLike<number>;
  phaseDeg: ArrayLike<number>;
}

/** The analytic loop at one frequency: magnitude in dB, phase in degrees on the sweep's branch. */
export type LoopPointEvaluator = (hz: number) => { magDb: number; phaseDeg: number };

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
 * regula falsi; x is ln f. Converges superlinearly; stops at |Δx| < 1e-15·|x| or g = 0.
 */
const refineRoot = (g: (x: number) => number, xa: number, xb: number, ga: number, gb: number): number => {
  let side = 0;
  for (let iter = 0; iter < 100; iter++) {
    const x = (xa * gb - xb * ga) / (gb - ga);
    const gx = g(x);
    if (gx === 0 || Math.abs(xb - xa) < 1e-15 * Math.max(1, Math.abs(x))) return x;
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
): { hz: number; direction: 'down' | 'up' }[] => {
  const out: { hz: number; direction: 'down' | 'up' }[] = [];
  for (let i = 0; i + 1 < f.length; i++) {
    const ga = y[i] - level;
    const gb = y[i + 1] - level;
    if (ga >= 0 === gb >= 0) continue;
    const xa = Math.log(f[i]);
    const xb = Math.log(f[i + 1]);
    let x: number;
    if (ga === 0) x = xa;
    else if (exact) x = refineRoot((xx) => exact(Math.exp(xx)) - level, xa, xb, ga, gb);
    else x = xa + ((xb - xa) * ga) / (ga - gb);
    out.push({ hz: Math.exp(x), direction: ga >= 0 ? 'down' : 'up' });
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
 * Margins of a loop from its sampled response (see the module header for the definitions).
 * @param sampled the sweep (phase already continuous, starting at its principal value)
 * @param evaluate the same loop as an analytic function; crossings are then exact
 *   (|T(fc)| = 1 to ~1e-12 dB) instead of interpolated.
 */
export const computeMargins = (sampled: SampledResponse, evaluate?: LoopPointEvaluator): Margins => {
  const { f, magDb, phaseDeg } = sampled;
  const gain = findCrossings(f, magDb, 0, evaluate && ((hz) => evaluate(hz).magDb));
  const phase = findCrossings(f, phaseDeg, -180, evaluate && ((hz) => evaluate(hz).phaseDeg));
  const crossings: Crossing[] = [
    ...gain.map((c) => ({ kind: 'gain' as const, ...c })),
    ...phase.map((c) => ({ kind: 'phase' as const, ...c })),
  ].sort((a, b) => a.hz - b.hz);

  const downs = gain.filter((c) => c.direction === 'down');
  const crossoverHz = downs.length > 0 ? downs[downs.length - 1].hz : null;
  const at = (hz: number) =>
    evaluate ? evaluate(hz) : { magDb: interpolateLogF(f, magDb, hz), phaseDeg: interpolateLogF(f, phaseDeg, hz) };

  const phaseMarginDeg = crossoverHz === null ? null : 180 + at(crossoverHz).phaseDeg;
  const gmCrossing = phase.find((c) => c.direction === 'down' && (crossoverHz === null || c.hz > crossoverHz));
  const phaseCrossoverHz = gmCrossing ? gmCrossing.hz : null;
  const gainMarginDb = phaseCrossoverHz === null ? null : -at(phaseCrossoverHz).magDb;
  return { crossoverHz, phaseMarginDeg, gainMarginDb, phaseCrossoverHz, crossings };
};
