/**
 * Logarithmic frequency sweeps and Bode traces of sectioned transfers.
 *
 * The hot loops work on plain numbers (no complex objects): each section [1, a1, a2] at ω is
 * re = 1 − a2·ω², im = a1·ω; sections are paired into terms N/D (see planTransfer), whose
 * angle is one arctangent of N·conj(D). Magnitudes collect Π|N|² and Π|D|² and take one
 * division and one logarithm per point. The phase is the continuous raw phase shifted by one
 * multiple of 360° so the trace starts at its principal value (see phaseOffsetDeg).
 * Where no grid step can turn the phase by a radian, a sweep advances the phase and the
 * logarithm from sample to sample instead, by short series for the usual small steps
 * (sweepByIncrements). Margins of a loop on a grid need no trace at all: scanPlan compares
 * |T|² with 1 and reads the sign of Im T per point.
 * Hot loops call only this module's functions and read imported constants into locals first:
 * in CommonJS output each use of an imported binding is an accessor call.
 */
import { DB_PER_LN_MAGSQ, phaseOffsetDeg, type SectionedTransfer } from './transfer';
import type { LoopPointEvaluator, LoopScan, SampledResponse, TraceCrossings } from './margins';
import type { BodeTrace, SweepOptions } from './types';

const TWO_PI = 2 * Math.PI;
const RAD2DEG = 180 / Math.PI;

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
  /** The largest step ln(f_{i+1}/f_i) (0 for fewer than two points): bounds a sweep's phase step. */
  lnStep: number;
}

export const makeGrid = (f: readonly number[]): Grid => {
  const w = new Array<number>(f.length);
  let ratio = 1;
  for (let i = 0; i < f.length; i++) {
    w[i] = TWO_PI * f[i];
    if (i > 0 && f[i] / f[i - 1] > ratio) ratio = f[i] / f[i - 1];
  }
  return { f, w, lnStep: Math.log(ratio) };
};

/**
 * The grid of a sweep's options. The last few are kept and shared by every result that sweeps
 * the same frequencies (analyses of the designs in use, the drag loop, the corner and spread
 * runs): building one costs two passes with exponentials. Their arrays are read-only by
 * contract and not frozen, because V8 boxes every element of a frozen array of doubles and the
 * sweeps, which read them per point, then run a third slower (measured).
 */
const recentGrids: { fStart: number; fStop: number; points: number; grid: Grid }[] = [];
const RECENT_GRIDS = 8;

export const sweepGrid = (fStart: number, fStop: number, points: number): Grid => {
  for (let k = 0; k < recentGrids.length; k++) {
    const g = recentGrids[k];
    if (g.fStart === fStart && g.fStop === fStop && g.points === points) return g.grid;
  }
  const grid = makeGrid(logSweep(fStart, fStop, points));
  if (recentGrids.length >= RECENT_GRIDS) recentGrids.shift();
  recentGrids.push({ fStart, fStop, points, grid });
  return grid;
};

/**
 * A sectioned transfer prepared for evaluation at many frequencies: terms N_k/D_k, each a
 * numerator and a denominator section (either may be the constant 1), stored flat as
 * [n1, n2, d1, d2] per term (section 1 + a1·s + a2·s²). One arctangent of N·conj(D) per term
 * gives ∠N − ∠D exactly when that difference cannot leave (−180°, 180°), so the principal value
 * is the continuous one. What a section's angle can do is known from its coefficients alone:
 * with a2 ≤ 0 its real part 1 − a2·ω² stays positive, so the angle stays in (0°, 90°) or
 * (−90°, 0°) by the sign of a1; with a2 > 0 in (0°, 180°) or (−180°, 0°). A numerator pairs
 * with the first denominator whose range, subtracted, keeps the term inside (−180°, 180°)
 * (first the usual same-sign pairs, then any other that fits, e.g. the right-half-plane zero
 * of a boost with its load pole). Before pairing, first-order sections of one kind and sign
 * are multiplied two by two into one quadratic ((1 + as)(1 + bs) = 1 + (a+b)s + ab·s², angle
 * in (0°, 180°)): the real poles of a finite op-amp's stage, or a DCM plant's two poles, then
 * cost one arctangent per pair instead of one each.
 */
export interface TransferPlan {
  gain: number;
  /** Power of s (originOrder). */
  order: number;
  /** Constant phase, rad: 180° for a negative gain plus 90° per origin order. */
  ph0: number;
  terms: number[];
  /**
   * A bound on |d(phase)/d(ln ω)| in rad: per section 1/2 for one real root, 1 for two, and
   * 1 + 1/ζ for a complex pair of damping ζ (its slope peaks at 1/ζ at resonance); Infinity
   * for an undamped pair.
   */
  slope: number;
}

/** a2 of a section [1, a1] or [1, a1, a2]. */
const a2Of = (p: readonly number[]): number => (p.length > 2 ? p[2] : 0);

/** The range of a section's angle over ω > 0 in quarter turns [lo, hi], or null when it can jump (a1 = 0). */
const angleRange = (p: readonly number[], isDen: boolean): [number, number] | null => {
  const a1 = p[1];
  const a2 = a2Of(p);
  if (a1 > 0) return a2 > 0 ? [0, 2] : [0, 1];
  if (a1 < 0) return a2 > 0 ? [-2, 0] : [-1, 0];
  // a1 = 0: a lossless resonance, 0° then 180°; a denominator of it paired as a1 ≥ 0 always was.
  return isDen && a2 > 0 ? [0, 2] : null;
};

/** First-order sections of one sign multiplied two by two into quadratics (see TransferPlan). */
const mergeFirstOrder = (sections: readonly (readonly number[])[]): (readonly number[])[] => {
  const out: (readonly number[])[] = [];
  const waiting: Record<'pos' | 'neg', number | null> = { pos: null, neg: null };
  for (const p of sections) {
    if (a2Of(p) !== 0 || p[1] === 0) {
      out.push(p);
      continue;
    }
    const key = p[1] > 0 ? 'pos' : 'neg';
    const a = waiting[key];
    if (a === null) waiting[key] = p[1];
    else {
      out.push([1, a + p[1], a * p[1]]);
      waiting[key] = null;
    }
  }
  for (const a of [waiting.pos, waiting.neg]) if (a !== null) out.push([1, a]);
  return out;
};

const fits = (n: readonly number[], d: readonly number[]): boolean => {
  const rn = angleRange(n, false);
  const rd = angleRange(d, true);
  return rn !== null && rd !== null && rn[0] - rd[1] >= -2 && rn[1] - rd[0] <= 2;
};

/** The phase-slope bound of one section 1 + a1·s + a2·s² (see TransferPlan.slope). */
const sectionSlope = (a1: number, a2: number): number => {
  if (a2 === 0) return a1 === 0 ? 0 : 0.5;
  if (a2 < 0) return 1;
  if (a1 === 0) return Infinity;
  const zeta = Math.abs(a1) / (2 * Math.sqrt(a2));
  return zeta >= 1 ? 1 : 1 + 1 / zeta;
};

export const planTransfer = (h: SectionedTransfer): TransferPlan => {
  const terms: number[] = [];
  const nums = mergeFirstOrder(h.num);
  const dens = mergeFirstOrder(h.den);
  for (const n of nums) {
    let k = dens.findIndex((d) => (n[1] > 0 && d[1] >= 0) || (n[1] < 0 && d[1] < 0));
    if (k < 0) k = dens.findIndex((d) => fits(n, d));
    const d = k >= 0 ? dens.splice(k, 1)[0] : undefined;
    terms.push(n[1], a2Of(n), d ? d[1] : 0, d ? a2Of(d) : 0);
  }
  for (const d of dens) terms.push(0, 0, d[1], a2Of(d));
  let slope = 0;
  for (let k = 0; k < terms.length; k += 2) slope += sectionSlope(terms[k], terms[k + 1]);
  return { gain: h.gain, order: h.originOrder, ph0: (h.gain < 0 ? Math.PI : 0) + (h.originOrder * Math.PI) / 2, terms, slope };
};

/**
 * The plan of a product H1·H2 from the plans of its factors: gains multiply, origin orders,
 * constant phases and slope bounds add, terms follow one another (each term keeps its angle
 * range, so the sum stays continuous). A loop's plan from the plant's, kept for the design,
 * and the compensator's: no second pairing of sections per analysis.
 */
export const productPlan = (a: TransferPlan, b: TransferPlan): TransferPlan => {
  const terms = a.terms.slice();
  for (let k = 0; k < b.terms.length; k++) terms.push(b.terms[k]);
  return { gain: a.gain * b.gain, order: a.order + b.order, ph0: a.ph0 + b.ph0, terms, slope: a.slope + b.slope };
};

/** The factor gain²·ω^(2n) of |H|², as a numerator part (n > 0) … */
const originNum = (p: TransferPlan, w2: number): number => (p.order > 0 ? p.gain * p.gain * Math.pow(w2, p.order) : p.gain * p.gain);
/** … and a denominator part (n < 0; an integrator gives ω²). */
const originDen = (p: TransferPlan, w2: number): number => (p.order >= 0 ? 1 : p.order === -1 ? w2 : Math.pow(w2, -p.order));

/**
 * atan2(y, x) as Math.atan(y/x), plus a half turn for x < 0: the same principal value (to an
 * ulp), about a third cheaper than Math.atan2 in V8 (measured on the sweep's arguments).
 */
const angleOf = (y: number, x: number): number => {
  if (x > 0) return Math.atan(y / x);
  if (x < 0) return Math.atan(y / x) + (y >= 0 ? Math.PI : -Math.PI);
  return y > 0 ? Math.PI / 2 : y < 0 ? -Math.PI / 2 : 0;
};

/**
 * A loop's trace as the sum of its plant's and compensator's traces (analyze.ts), the phase
 * moved by one multiple of 360° to start at its principal value, with what the margins and
 * checks look for noted in the same pass: the intervals where the magnitude passes 0 dB and
 * the phase −180° (TraceCrossings) and the first sample where the phase is below −180° while
 * |T| > 0 dB; with `near`, the samples it asks for and the intervals they give (NearWatch).
 */
export interface LoopPass {
  magDb: number[];
  phaseDeg: number[];
  crossings: TraceCrossings;
  belowMinus180Hz: number | null;
}

export const loopPass = (base: BodeTrace, comp: BodeTrace, f: readonly number[], near?: NearWatch): LoopPass => {
  const n = f.length;
  const bm = base.magDb;
  const bp = base.phaseDeg;
  const cm = comp.magDb;
  const cp = comp.phaseDeg;
  const magDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  const gainAt: number[] = [];
  const phaseAt: number[] = [];
  let belowMinus180Hz: number | null = null;
  // Without a watch its bounds are negative: nothing is noted and no test of `near` runs per sample.
  const nearGain = near !== undefined ? near.gainAt : gainAt;
  const nearPhase = near !== undefined ? near.phaseAt : phaseAt;
  const db = near !== undefined ? near.db : -1;
  const deg = near !== undefined ? near.deg : -1;
  const shift = n > 0 ? phaseOffsetDeg(bp[0] + cp[0]) : 0;
  let prevM = 0;
  let prevQ = 0;
  for (let i = 0; i < n; i++) {
    const m = bm[i] + cm[i];
    const p = bp[i] + cp[i] + shift;
    magDb[i] = m;
    phaseDeg[i] = p;
    // q = p + 180 is exact near −180° (Sterbenz), so q < 0 is p < −180.
    const q = p + 180;
    // The product tests first (a sign change needs it ≤ 0): cheaper than two boolean compares.
    if (i > 0) {
      if (m * prevM <= 0 && m >= 0 !== prevM >= 0) gainAt.push(i - 1);
      if (q * prevQ <= 0 && q >= 0 !== prevQ >= 0) phaseAt.push(i - 1);
    }
    if (q < 0 && m > 0 && belowMinus180Hz === null) belowMinus180Hz = f[i];
    if (Math.abs(m) <= db) nearGain.push(i);
    if (Math.abs(q) <= deg) nearPhase.push(i);
    prevM = m;
    prevQ = q;
  }
  const crossings = { gainAt, phaseAt };
  if (near !== undefined && n > 0 && Math.abs(phaseDeg[0]) + deg < 180) near.only = scanCandidates(crossings, near, n);
  return { magDb, phaseDeg, crossings, belowMinus180Hz };
};

/**
 * Evaluate a sectioned transfer on a grid (hot path: plain numbers, output arrays allocated
 * once at their final size). Where the plan's slope bound allows, sweepByIncrements; else term
 * by term here, one arctangent per term and one logarithm per point:
 * magDb = 10·log10(gain²·ω^(2n)·Π|N_k|² / Π|D_k|²) (one division, one logarithm);
 * phase = ph0 + Σ ∠(N_k·conj(D_k)) + offset,
 * the offset chosen at the first point (see phaseOffsetDeg). The loop body repeats
 * {@link transferEvaluator}'s arithmetic instead of calling it: a call per point costs a
 * quarter more here, and the same operations keep the two equal to the last bit. This path is
 * for transfers whose phase can turn by a radian between samples (a sharp resonance on a
 * coarse grid).
 */
export const sweepTransfer = (h: SectionedTransfer, grid: Grid): BodeTrace => sweepPlan(planTransfer(h), grid);

/** sweepTransfer of a transfer already planned (planTransfer). */
export const sweepPlan = (plan: TransferPlan, grid: Grid): BodeTrace => {
  // No step can turn the phase by a radian: steps from sample to sample.
  if (plan.slope * grid.lnStep < 1) return sweepByIncrements(plan, grid);
  const n = grid.f.length;
  const magDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  const t = plan.terms;
  // The origin factor gain²·ω^(2n) of |H|² (see originNum, originDen), read once.
  const g2 = plan.gain * plan.gain;
  const order = plan.order;
  const w = grid.w;
  const dbPerLn = DB_PER_LN_MAGSQ;
  let offsetDeg = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    const wi2 = wi * wi;
    // Term by term as in transferEvaluator (the same operations in the same order).
    let num = order > 0 ? g2 * Math.pow(wi2, order) : g2;
    let den = order >= 0 ? 1 : order === -1 ? wi2 : Math.pow(wi2, -order);
    let ph = plan.ph0;
    for (let k = 0; k < t.length; k += 4) {
      const nre = 1 - t[k + 1] * wi2;
      const nim = t[k] * wi;
      const dre = 1 - t[k + 3] * wi2;
      const dim = t[k + 2] * wi;
      num *= nre * nre + nim * nim;
      den *= dre * dre + dim * dim;
      ph += angleOf(nim * dre - nre * dim, nre * dre + nim * dim);
    }
    ph *= RAD2DEG;
    if (i === 0) offsetDeg = phaseOffsetDeg(ph);
    const m = dbPerLn * Math.log(num / den);
    const p = ph + offsetDeg;
    magDb[i] = m;
    phaseDeg[i] = p;
  }
  return { magDb, phaseDeg };
};

/**
 * A loop's crossing candidates on a grid (see LoopScan) without forming its samples: per
 * point the products Π|N_k|² and Π|D_k|² (with the origin factors) as in sweepTransfer, so
 * |T|² ≥ 1 is a comparison, and C = Π N_k·conj(D_k), whose imaginary part after the quarter
 * turns of j^n has the sign of Im T times the sign of the gain (Π|D_k|² and ω^n are
 * positive). No division, logarithm or arctangent per point; |T|² is formed only at the ends
 * of a gain interval. Returns the analytic loop on the sweep's branch as well, for refining.
 * The margins of a compensator on a plant: snapped parts, the spread's samples, the
 * starting point's search.
 */
export const scanTransfer = (h: SectionedTransfer, grid: Grid): { scan: LoopScan; evaluate: LoopPointEvaluator } =>
  scanPlan(planTransfer(h), grid);

/**
 * What a loop's pass notes for a second loop known to lie within `db` dB and `deg` degrees of
 * it at every frequency (the loop with the compensator's parts snapped: ratioBound): the
 * samples where this loop is within db of 0 dB (gainAt) and within deg of −180° (phaseAt).
 * The second loop can cross 0 dB or −180° only in an interval that touches one of them or
 * where this loop crosses too; the pass leaves those intervals in `only` (scanCandidates) when
 * both loops start on the same branch, i.e. this one starts farther than deg from ±180°
 * (both start at their principal values).
 */
export interface NearWatch {
  db: number;
  deg: number;
  gainAt: number[];
  phaseAt: number[];
  only?: ScanCandidates;
}

export const nearWatch = (db: number, deg: number): NearWatch => ({ db, deg, gainAt: [], phaseAt: [] });

/**
 * The grid intervals i (between samples i and i+1) a scan must look at, ascending: where
 * |T|² may pass 1 and where the phase may pass −180° (a superset of the latter; marginsFromScan
 * keeps those where the continuous phase does).
 */
export interface ScanCandidates {
  gainAt: number[];
  phaseAt: number[];
}

/** `crossed` plus the intervals on either side of each sample in `near`, ascending and distinct (n samples). */
const widen = (crossed: readonly number[], near: readonly number[], n: number): number[] => {
  const out: number[] = [];
  let a = 0;
  let b = 0;
  let last = -1;
  const take = (i: number) => {
    if (i > last && i >= 0 && i < n - 1) out.push((last = i));
  };
  while (a < crossed.length || b < near.length) {
    // Each sample i of `near` touches the intervals i − 1 and i.
    if (b >= near.length || (a < crossed.length && crossed[a] < near[b] - 1)) take(crossed[a++]);
    else {
      take(near[b] - 1);
      take(near[b++]);
    }
  }
  return out;
};

/**
 * The intervals where a second loop within the watch's bounds of this one may cross (see
 * NearWatch): outside them both of its samples lie on this loop's side of 0 dB and of −180°.
 * `crossings` are this loop's own (LoopPass).
 */
export const scanCandidates = (crossings: TraceCrossings, near: NearWatch, n: number): ScanCandidates => ({
  gainAt: widen(crossings.gainAt, near.gainAt, n),
  phaseAt: widen(crossings.phaseAt, near.phaseAt, n),
});

/** One sample of a scan: Π|N|²·origin, Π|D|²·origin and the sign-carrying Im(j^n·C)·sign(gain). */
const scanPoint = { num: 0, den: 1, im: 0 };

const scanSample = (plan: TransferPlan, g2: number, turns: number, wi: number): void => {
  const t = plan.terms;
  const order = plan.order;
  const wi2 = wi * wi;
  let num = order > 0 ? g2 * Math.pow(wi2, order) : g2;
  let den = order >= 0 ? 1 : order === -1 ? wi2 : Math.pow(wi2, -order);
  let cr = 1;
  let ci = 0;
  for (let k = 0; k < t.length; k += 4) {
    const nre = 1 - t[k + 1] * wi2;
    const nim = t[k] * wi;
    const dre = 1 - t[k + 3] * wi2;
    const dim = t[k + 2] * wi;
    num *= nre * nre + nim * nim;
    den *= dre * dre + dim * dim;
    const xr = nre * dre + nim * dim;
    const xi = nim * dre - nre * dim;
    const c = cr * xr - ci * xi;
    ci = cr * xi + ci * xr;
    cr = c;
  }
  scanPoint.num = num;
  scanPoint.den = den;
  // Im(j^n·C): j·(a + jb) = −b + ja.
  scanPoint.im = (plan.gain < 0 ? -1 : 1) * (turns === 0 ? ci : turns === 1 ? cr : turns === 2 ? -ci : -cr);
};

/**
 * scanTransfer of a transfer already planned (planTransfer, productPlan). With `only`, just
 * the ends of those intervals are computed (see ScanCandidates): the gain intervals found are
 * a full scan's, the phase candidates are `only.phaseAt` itself, and the margins are the same.
 */
export const scanPlan = (plan: TransferPlan, grid: Grid, only?: ScanCandidates): { scan: LoopScan; evaluate: LoopPointEvaluator } => {
  const g2 = plan.gain * plan.gain;
  const turns = ((plan.order % 4) + 4) % 4;
  const w = grid.w;
  const evaluate = planEvaluator(plan, grid.f[0]);
  if (only !== undefined) {
    const scan: LoopScan = { gainAt: [], gainMagSq: [], phaseAt: only.phaseAt };
    let at = -1;
    let atHigh = false;
    let atMagSq = 0;
    for (let k = 0; k < only.gainAt.length; k++) {
      const i = only.gainAt[k];
      let high: boolean = atHigh;
      let magSq = atMagSq;
      if (at !== i) {
        scanSample(plan, g2, turns, w[i]);
        high = scanPoint.num >= scanPoint.den;
        magSq = scanPoint.num / scanPoint.den;
      }
      scanSample(plan, g2, turns, w[i + 1]);
      at = i + 1;
      atHigh = scanPoint.num >= scanPoint.den;
      atMagSq = scanPoint.num / scanPoint.den;
      if (high !== atHigh) {
        scan.gainAt.push(i);
        scan.gainMagSq.push(magSq, atMagSq);
      }
    }
    return { scan, evaluate };
  }
  const n = w.length;
  const scan: LoopScan = { gainAt: [], gainMagSq: [], phaseAt: [] };
  let prevHigh = false;
  let prevPos = false;
  let prevMagSq = 0;
  for (let i = 0; i < n; i++) {
    scanSample(plan, g2, turns, w[i]);
    const high = scanPoint.num >= scanPoint.den;
    const pos = scanPoint.im >= 0;
    const magSq = scanPoint.num / scanPoint.den;
    if (i > 0) {
      if (prevHigh !== high) {
        scan.gainAt.push(i - 1);
        scan.gainMagSq.push(prevMagSq, magSq);
      }
      if (prevPos !== pos) scan.phaseAt.push(i - 1);
    }
    prevHigh = high;
    prevPos = pos;
    prevMagSq = magSq;
  }
  return { scan, evaluate };
};

/** Every ANCHOR-th sample of sweepByIncrements is computed term by term. */
const ANCHOR = 64;

/** The series below are used for |x| < 1/16, i.e. x² under this. */
const SERIES_MAX_SQ = 1 / 256;

/**
 * atan(x) for a sweep's phase step: for |x| < 1/16 its Maclaurin series
 * x − x³/3 + x⁵/5 − … to x¹¹ (Abramowitz & Stegun, Handbook of Mathematical Functions, ch. 4);
 * the first term left out is below 3e-16 of x, under the rounding of the sum. Math.atan
 * otherwise. V8 inlines it; per sample it costs well under the built-in's call (measured).
 */
export const atanStep = (x: number): number => {
  const x2 = x * x;
  if (x2 >= SERIES_MAX_SQ) return Math.atan(x);
  return x * (1 + x2 * (-1 / 3 + x2 * (1 / 5 + x2 * (-1 / 7 + x2 * (1 / 9 + x2 * (-1 / 11))))));
};

/**
 * ln q from ln qp (`lnPrev`) for neighbouring samples q, qp > 0: ln(q/qp) = 2·artanh(s) with
 * s = (q − qp)/(q + qp), by the series 2(s + s³/3 + … + s¹¹/11) (same source) while |s| < 1/16,
 * i.e. q/qp within 0.88…1.13, as between samples of a smooth trace; Math.log(q) otherwise.
 */
export const lnStep = (lnPrev: number, q: number, qp: number): number => {
  const s = (q - qp) / (q + qp);
  const s2 = s * s;
  // Written so that a NaN s (q = qp = 0) also takes Math.log.
  if (!(s2 < SERIES_MAX_SQ)) return Math.log(q);
  return lnPrev + 2 * s * (1 + s2 * (1 / 3 + s2 * (1 / 5 + s2 * (1 / 7 + s2 * (1 / 9 + s2 * (1 / 11))))));
};

/**
 * ph0 + Σ ∠(N_k·conj(D_k)) over a plan's terms at ω (w2 = ω²), rad, one arctangent per term:
 * the continuous phase wherever each term stays inside (−180°, 180°) (see TransferPlan). The
 * anchors of sweepByIncrements and the evaluator's phase, so the two agree to the last bit.
 */
const termsAngle = (t: readonly number[], ph0: number, w: number, w2: number): number => {
  let ph = ph0;
  for (let k = 0; k < t.length; k += 4) {
    const nre = 1 - t[k + 1] * w2;
    const nim = t[k] * w;
    const dre = 1 - t[k + 3] * w2;
    const dim = t[k + 2] * w;
    ph += angleOf(nim * dre - nre * dim, nre * dre + nim * dim);
  }
  return ph;
};

/**
 * sweepTransfer when no grid step can turn the phase by a radian (the plan's slope bound times
 * the grid's largest log step is under 1): then the angle of C_i·conj(C_{i−1}),
 * C = Π N_k·conj(D_k), is the phase step itself (its real part is positive, so atan(Im/Re)
 * needs no branch), and ln|H|² steps by ln(q_i/q_{i−1}), q = |H|². Each ANCHOR-th sample (the
 * first included) is computed term by term as in transferEvaluator, so rounding cannot
 * accumulate; between anchors the steps are short series (atanStep, lnStep), which cost
 * far less than an arctangent and a logarithm per sample. The traces agree with the
 * term-by-term form to about 1e-13 dB and degrees.
 */
const sweepByIncrements = (plan: TransferPlan, grid: Grid): BodeTrace => {
  const n = grid.f.length;
  const magDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  const t = plan.terms;
  const nt = t.length;
  const n1 = nt > 0 ? t[0] : 0;
  const n2 = nt > 0 ? t[1] : 0;
  const d1 = nt > 0 ? t[2] : 0;
  const d2 = nt > 0 ? t[3] : 0;
  // The origin factor gain²·ω^(2n) of |H|² (see originNum, originDen), read once.
  const g2 = plan.gain * plan.gain;
  const order = plan.order;
  const w = grid.w;
  const dbPerLn = DB_PER_LN_MAGSQ;
  let offsetDeg = 0;
  let ph = 0;
  let lnq = 0;
  let qp = 1;
  let pr = 1;
  let pi = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    const wi2 = wi * wi;
    let num = order > 0 ? g2 * Math.pow(wi2, order) : g2;
    let den = order >= 0 ? 1 : order === -1 ? wi2 : Math.pow(wi2, -order);
    // The first term sets C (no product with 1 + 0j): about 5 % of the sweep (measured).
    let cr = 1;
    let ci = 0;
    if (nt > 0) {
      const nre = 1 - n2 * wi2;
      const nim = n1 * wi;
      const dre = 1 - d2 * wi2;
      const dim = d1 * wi;
      num *= nre * nre + nim * nim;
      den *= dre * dre + dim * dim;
      cr = nre * dre + nim * dim;
      ci = nim * dre - nre * dim;
    }
    for (let k = 4; k < nt; k += 4) {
      const nre = 1 - t[k + 1] * wi2;
      const nim = t[k] * wi;
      const dre = 1 - t[k + 3] * wi2;
      const dim = t[k + 2] * wi;
      num *= nre * nre + nim * nim;
      den *= dre * dre + dim * dim;
      const xr = nre * dre + nim * dim;
      const xi = nim * dre - nre * dim;
      const c = cr * xr - ci * xi;
      ci = cr * xi + ci * xr;
      cr = c;
    }
    const q = num / den;
    // The anchors' angles in a call of their own: with the arctangents inside the loop above,
    // every sample ran about a tenth slower (measured).
    if (i % ANCHOR === 0) {
      ph = termsAngle(t, plan.ph0, wi, wi2);
      lnq = Math.log(q);
    } else {
      ph += atanStep((ci * pr - cr * pi) / (cr * pr + ci * pi));
      lnq = lnStep(lnq, q, qp);
    }
    qp = q;
    // C is kept near unit size: only its angle is used.
    const scale = 1 / (Math.abs(cr) + Math.abs(ci));
    pr = cr * scale;
    pi = ci * scale;
    const deg = ph * RAD2DEG;
    if (i === 0) offsetDeg = phaseOffsetDeg(deg);
    magDb[i] = dbPerLn * lnq;
    phaseDeg[i] = deg + offsetDeg;
  }
  return { magDb, phaseDeg };
};

/**
 * The transfer as an analytic function: magnitude in dB and phase in degrees on the branch
 * that starts at `startHz` at its principal value, or at the multiple of 360° nearest
 * `startDeg` when given (e.g. a trace's first sample, to follow that trace). The arithmetic is
 * that of {@link sweepTransfer}: on a sweep's grid and branch it reproduces the trace (to the
 * last bit on the term-by-term path and at the anchors of sweepByIncrements, to about 1e-13
 * between them).
 * For crossing refinement and read-outs.
 */
export const transferEvaluator = (h: SectionedTransfer, startHz: number, startDeg?: number): LoopPointEvaluator =>
  planEvaluator(planTransfer(h), startHz, startDeg);

/** transferEvaluator of a transfer already planned. */
export const planEvaluator = (plan: TransferPlan, startHz: number, startDeg?: number): LoopPointEvaluator => {
  const t = plan.terms;
  const dbPerLn = DB_PER_LN_MAGSQ;
  let offsetDeg = 0;
  // Magnitude and phase each by itself (margins refine a crossing of one at a time); each is
  // the sweep's arithmetic for that quantity, operation for operation.
  const magDbAt = (hz: number): number => {
    const w = TWO_PI * hz;
    const w2 = w * w;
    let num = originNum(plan, w2);
    let den = originDen(plan, w2);
    for (let k = 0; k < t.length; k += 4) {
      const nre = 1 - t[k + 1] * w2;
      const nim = t[k] * w;
      const dre = 1 - t[k + 3] * w2;
      const dim = t[k + 2] * w;
      num *= nre * nre + nim * nim;
      den *= dre * dre + dim * dim;
    }
    return dbPerLn * Math.log(num / den);
  };
  const rawPhaseDeg = (hz: number): number => {
    const w = TWO_PI * hz;
    return termsAngle(t, plan.ph0, w, w * w) * RAD2DEG;
  };
  const phaseDegAt = (hz: number): number => rawPhaseDeg(hz) + offsetDeg;
  const evaluate: LoopPointEvaluator = (hz) => ({ magDb: magDbAt(hz), phaseDeg: phaseDegAt(hz) });
  evaluate.magDbAt = magDbAt;
  evaluate.phaseDegAt = phaseDegAt;
  const raw0 = rawPhaseDeg(startHz);
  offsetDeg = startDeg === undefined ? phaseOffsetDeg(raw0) : 360 * Math.round((startDeg - raw0) / 360);
  return evaluate;
};

/**
 * Complex samples H(jω) of a sectioned transfer on a grid with no transcendental call (for
 * margins from complex samples): P = Π N_k·conj(D_k) over the terms, then
 * H = gain·(jω)^n·P / Π|D_k|², one division per point.
 * `out` is filled (and grown to the grid size) instead of allocating, for repeated calls.
 */
export const sweepComplex = (
  h: SectionedTransfer,
  grid: Grid,
  out?: { re: number[]; im: number[] },
): { re: number[]; im: number[] } => {
  const n = grid.f.length;
  const re = out?.re ?? new Array<number>(n);
  const im = out?.im ?? new Array<number>(n);
  const plan = planTransfer(h);
  const t = plan.terms;
  const nt = t.length;
  // The first term in locals (a loop has two terms: plant and compensator).
  const n1 = nt > 0 ? t[0] : 0;
  const n2 = nt > 0 ? t[1] : 0;
  const d1 = nt > 0 ? t[2] : 0;
  const d2 = nt > 0 ? t[3] : 0;
  const order = plan.order;
  // j^order as a quarter-turn count 0…3.
  const turns = ((order % 4) + 4) % 4;
  const { w } = grid;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    const wi2 = wi * wi;
    const nre = 1 - n2 * wi2;
    const nim = n1 * wi;
    const dre = 1 - d2 * wi2;
    const dim = d1 * wi;
    let pr = nre * dre + nim * dim;
    let pi = nim * dre - nre * dim;
    let dd = dre * dre + dim * dim;
    for (let k = 4; k < nt; k += 4) {
      const kre = 1 - t[k + 1] * wi2;
      const kim = t[k] * wi;
      const lre = 1 - t[k + 3] * wi2;
      const lim = t[k + 2] * wi;
      const tr = kre * lre + kim * lim;
      const ti = kim * lre - kre * lim;
      const qr = pr * tr - pi * ti;
      pi = pr * ti + pi * tr;
      pr = qr;
      dd *= lre * lre + lim * lim;
    }
    // gain·ω^n/Π|D|² as one scale, then the quarter turns of j^n.
    let scale = plan.gain / dd;
    if (order === -1) scale /= wi;
    else if (order !== 0) scale *= Math.pow(wi, order);
    const sr = scale * pr;
    const si = scale * pi;
    re[i] = turns === 0 ? sr : turns === 1 ? -si : turns === 2 ? -sr : si;
    im[i] = turns === 0 ? si : turns === 1 ? sr : turns === 2 ? -si : -sr;
  }
  return { re, im };
};

/**
 * Any transfer (e.g. a loop built by hand) as a sampled response on `f` plus its analytic
 * evaluator on the same phase branch, ready for computeMargins.
 */
export const transferResponse = (
  h: SectionedTransfer,
  f: readonly number[],
): { sampled: SampledResponse; evaluate: LoopPointEvaluator } => {
  const trace = sweepTransfer(h, makeGrid(f));
  return { sampled: { f, ...trace }, evaluate: transferEvaluator(h, f[0], trace.phaseDeg[0]) };
};
