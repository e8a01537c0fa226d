/**
 * Logarithmic frequency sweeps and Bode traces of sectioned transfers.
 *
 * The hot loop works on plain numbers (no complex objects): for each section [1, a1, a2]
 * at ω it forms re = 1 − a2·ω², im = a1·ω, multiplies |·|² and adds atan2(im, re).
 * Phase is the continuous raw phase of transfer.ts shifted by one multiple of 360° so the
 * trace starts at its principal value (see phaseOffsetDeg).
 */
import { dbFromMagSq, phaseOffsetDeg, transferPointRaw, type SectionedTransfer } from './transfer';
import type { LoopPointEvaluator, SampledResponse } from './margins';
import type { BodeTrace, SweepOptions } from './types';

const TWO_PI = 2 * Math.PI;
const RAD2DEG = 180 / Math.PI;
const DB_PER_LOG10_MAGSQ = 10;

/** Default sweep: 10 Hz to fsw/2, 400 points, logarithmic. */
export const defaultSweep = (fsw: number): SweepOptions => ({ fStart: 10, fStop: fsw / 2, points: 400 });

/**
 * `points` frequencies from fStart to fStop inclusive, equally spaced in log f, Hz:
 * f_i = fStart·r^i with r = (fStop/fStart)^(1/(n−1)); the end points are exact.
 */
export const logSweep = (fStart: number, fStop: number, points: number): number[] => {
  const n = Math.max(2, Math.round(points));
  const a = Math.log(fStart);
  const step = (Math.log(fStop) - a) / (n - 1);
  const r = Math.exp(step);
  const f: number[] = [];
  // Re-anchor with exp every 64 points so rounding of the running product cannot drift.
  for (let i = 0; i < n; i++) f.push(i % 64 === 0 ? Math.exp(a + step * i) : f[i - 1] * r);
  f[0] = fStart;
  f[n - 1] = fStop;
  return f;
};

/** Angular frequencies 2πf and their squares, computed once per grid. */
export interface Grid {
  f: readonly number[];
  w: Float64Array;
  w2: Float64Array;
}

export const makeGrid = (f: readonly number[]): Grid => {
  const w = new Float64Array(f.length);
  const w2 = new Float64Array(f.length);
  for (let i = 0; i < f.length; i++) {
    w[i] = TWO_PI * f[i];
    w2[i] = w[i] * w[i];
  }
  return { f, w, w2 };
};

/**
 * Phase plan of a transfer: terms N_k/D_k, each a numerator and a denominator section
 * (either may be the constant 1), stored flat as [n1, n2, d1, d2] per term. One atan2 of
 * N·conj(D) per term gives ∠N − ∠D exactly when both angles lie on the same side: a numerator
 * with a1 > 0 (angle in (0°, 180°)) pairs with a denominator with a1 ≥ 0 ([0°, 180°]), and
 * a1 < 0 with a1 < 0; the difference then stays inside (−180°, 180°), so the principal value
 * is the continuous one. Unpaired sections form terms of their own.
 */
const phasePlan = (h: SectionedTransfer): Float64Array => {
  const coef = (p: readonly number[] | undefined): [number, number] => (p ? [p[1] ?? 0, p[2] ?? 0] : [0, 0]);
  const dens = [...h.den];
  const terms: number[] = [];
  for (const n of h.num) {
    const k = dens.findIndex((d) => (n[1] > 0 && d[1] >= 0) || (n[1] < 0 && d[1] < 0));
    const d = k >= 0 ? dens.splice(k, 1)[0] : undefined;
    terms.push(...coef(n), ...coef(d));
  }
  for (const d of dens) terms.push(0, 0, ...coef(d));
  return Float64Array.from(terms);
};

/** A transfer swept on a grid. */
export interface TransferSweep {
  /** Magnitude (dB) and phase (deg), the phase starting at its principal value. */
  trace: BodeTrace;
  /** The multiple of 360° added to the raw section phase (see phaseOffsetDeg). */
  offsetDeg: number;
  /** H(jω) as complex samples, when asked for. */
  re?: Float64Array;
  im?: Float64Array;
}

/**
 * Evaluate a sectioned transfer on a grid (hot path: plain numbers, one atan2 per term, one
 * log10 per point; output arrays are allocated once at their final size).
 * magDb = 10·log10(gain²·ω^(2n)·Π|num|²/Π|den|²); phase = Σ term angles + 90°·n (+180° for a
 * negative gain) + offset, the offset chosen at the first point.
 * With `withComplex`, H(jω) = gain·(jω)^n·Π N·conj(D)/|D|² is accumulated from the same terms.
 */
export const sweepTransfer = (h: SectionedTransfer, grid: Grid, withComplex = false): TransferSweep => {
  const n = grid.f.length;
  const magDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  const re = withComplex ? new Float64Array(n) : undefined;
  const im = withComplex ? new Float64Array(n) : undefined;
  const g2 = h.gain * h.gain;
  const ph0 = (h.gain < 0 ? Math.PI : 0) + (h.originOrder * Math.PI) / 2;
  const order = h.originOrder;
  const plan = phasePlan(h);
  const nt = plan.length;
  const { w, w2 } = grid;
  let offsetDeg = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    const wi2 = w2[i];
    let m = g2;
    if (order === -1) m /= wi2;
    else if (order !== 0) m *= Math.pow(wi2, order);
    let ph = ph0;
    let pr = 1;
    let pi = 0;
    for (let k = 0; k < nt; k += 4) {
      const nre = 1 - plan[k + 1] * wi2;
      const nim = plan[k] * wi;
      const dre = 1 - plan[k + 3] * wi2;
      const dim = plan[k + 2] * wi;
      const d2 = dre * dre + dim * dim;
      m *= (nre * nre + nim * nim) / d2;
      // N·conj(D): its angle is ∠N − ∠D
      const tr = nre * dre + nim * dim;
      const ti = nim * dre - nre * dim;
      ph += Math.atan2(ti, tr);
      if (re) {
        const qr = (pr * tr - pi * ti) / d2;
        pi = (pr * ti + pi * tr) / d2;
        pr = qr;
      }
    }
    if (i === 0) offsetDeg = phaseOffsetDeg(ph * RAD2DEG);
    magDb[i] = DB_PER_LOG10_MAGSQ * Math.log10(m);
    phaseDeg[i] = ph * RAD2DEG + offsetDeg;
    if (re && im) {
      // × gain·(jω)^order
      for (let k = 0; k < order; k++) {
        const t = -pi * wi;
        pi = pr * wi;
        pr = t;
      }
      for (let k = 0; k > order; k--) {
        const t = pi / wi;
        pi = -pr / wi;
        pr = t;
      }
      re[i] = h.gain * pr;
      im[i] = h.gain * pi;
    }
  }
  return { trace: { magDb, phaseDeg }, offsetDeg, re, im };
};

/**
 * Complex response on a grid: re and im of N(jω)/D(jω) for ascending polynomials (Horner).
 * `out` (length ≥ grid size) is filled instead of allocating, for repeated calls.
 */
export const sweepComplex = (
  num: readonly number[],
  den: readonly number[],
  grid: Grid,
  out?: { re: Float64Array; im: Float64Array },
): { re: Float64Array; im: Float64Array } => {
  const n = grid.f.length;
  const re = out?.re ?? new Float64Array(n);
  const im = out?.im ?? new Float64Array(n);
  const { w } = grid;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    let nr = 0;
    let ni = 0;
    for (let k = num.length - 1; k >= 0; k--) {
      const t = -ni * wi + num[k];
      ni = nr * wi;
      nr = t;
    }
    let dr = 0;
    let di = 0;
    for (let k = den.length - 1; k >= 0; k--) {
      const t = -di * wi + den[k];
      di = dr * wi;
      dr = t;
    }
    const d2 = dr * dr + di * di;
    re[i] = (nr * dr + ni * di) / d2;
    im[i] = (ni * dr - nr * di) / d2;
  }
  return { re, im };
};

/** Trace of one transfer on a grid, phase starting at its principal value. */
export const bodeTrace = (h: SectionedTransfer, grid: Grid): BodeTrace => sweepTransfer(h, grid).trace;

/**
 * Any transfer (e.g. a loop built by hand) as a sampled response on `f` plus its analytic
 * evaluator on the same phase branch, ready for computeMargins.
 */
export const transferResponse = (
  h: SectionedTransfer,
  f: readonly number[],
): { sampled: SampledResponse; evaluate: LoopPointEvaluator } => {
  const { trace, offsetDeg } = sweepTransfer(h, makeGrid(f));
  const evaluate: LoopPointEvaluator = (hz) => {
    const p = transferPointRaw(h, hz);
    return { magDb: dbFromMagSq(p.magSq), phaseDeg: p.phaseRawDeg + offsetDeg };
  };
  return { sampled: { f, ...trace }, evaluate };
};
