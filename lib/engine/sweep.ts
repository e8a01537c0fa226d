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
/** 10·log10(x) = DB_PER_LN_MAGSQ·ln(x); Math.log is markedly faster than Math.log10 in V8. */
const DB_PER_LN_MAGSQ = 10 / Math.LN10;

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
  const f = new Array<number>(n);
  // Re-anchor with exp every 64 points so rounding of the running product cannot drift.
  let x = 0;
  for (let i = 0; i < n; i++) {
    x = i % 64 === 0 ? Math.exp(a + step * i) : x * r;
    f[i] = x;
  }
  f[0] = fStart;
  f[n - 1] = fStop;
  return f;
};

/** Frequencies (Hz) and angular frequencies 2πf (rad/s), computed once per grid. */
export interface Grid {
  f: readonly number[];
  w: readonly number[];
}

export const makeGrid = (f: readonly number[]): Grid => {
  const w = new Array<number>(f.length);
  for (let i = 0; i < f.length; i++) w[i] = TWO_PI * f[i];
  return { f, w };
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
 * logarithm per point; output arrays are allocated once at their final size).
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
  // The first term in locals: most transfers (plant, every compensator type) have one.
  const n1 = nt > 0 ? plan[0] : 0;
  const n2 = nt > 0 ? plan[1] : 0;
  const d1 = nt > 0 ? plan[2] : 0;
  const d2 = nt > 0 ? plan[3] : 0;
  const w = grid.w;
  let offsetDeg = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    const wi2 = wi * wi;
    let m = g2;
    if (order === -1) m /= wi2;
    else if (order !== 0) m *= Math.pow(wi2, order);
    // First term: N·conj(D), whose angle is ∠N − ∠D.
    const nre = 1 - n2 * wi2;
    const nim = n1 * wi;
    const dre = 1 - d2 * wi2;
    const dim = d1 * wi;
    const dd = dre * dre + dim * dim;
    let pr = nre * dre + nim * dim;
    let pi = nim * dre - nre * dim;
    m *= (nre * nre + nim * nim) / dd;
    let ph = ph0 + Math.atan2(pi, pr);
    pr /= dd;
    pi /= dd;
    for (let k = 4; k < nt; k += 4) {
      const kre = 1 - plan[k + 1] * wi2;
      const kim = plan[k] * wi;
      const lre = 1 - plan[k + 3] * wi2;
      const lim = plan[k + 2] * wi;
      const l2 = lre * lre + lim * lim;
      m *= (kre * kre + kim * kim) / l2;
      const tr = kre * lre + kim * lim;
      const ti = kim * lre - kre * lim;
      ph += Math.atan2(ti, tr);
      const qr = (pr * tr - pi * ti) / l2;
      pi = (pr * ti + pi * tr) / l2;
      pr = qr;
    }
    if (i === 0) offsetDeg = phaseOffsetDeg(ph * RAD2DEG);
    magDb[i] = DB_PER_LN_MAGSQ * Math.log(m);
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
 * Complex response on a grid: re and im of N(jω)/D(jω) for ascending polynomials (Horner),
 * multiplied sample by sample by `times` when given (e.g. the plant, to form the loop).
 * `out` (length ≥ grid size) is filled instead of allocating, for repeated calls.
 */
export const sweepComplex = (
  num: readonly number[],
  den: readonly number[],
  grid: Grid,
  out?: { re: Float64Array; im: Float64Array },
  times?: { re: ArrayLike<number>; im: ArrayLike<number> },
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
    const hr = (nr * dr + ni * di) / d2;
    const hi = (ni * dr - nr * di) / d2;
    if (times) {
      const tr = times.re[i];
      const ti = times.im[i];
      re[i] = hr * tr - hi * ti;
      im[i] = hr * ti + hi * tr;
    } else {
      re[i] = hr;
      im[i] = hi;
    }
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
