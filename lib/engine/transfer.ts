/**
 * Rational transfer functions kept in sections, so that the phase is continuous by construction.
 *
 *   H(s) = gain · s^originOrder · Π num[i](s) / Π den[k](s)
 *
 * Every section is a real polynomial of degree ≤ 2 with constant term 1 (ascending
 * coefficients [1, a1, a2]). At s = jω its imaginary part a1·ω never changes sign for ω > 0,
 * so atan2 of one section never jumps: summing section angles gives a continuous phase
 * without sample-to-sample unwrapping, at any frequency; sweep.ts evaluates it the same way
 * on a grid (sweepTransfer) and at single frequencies (transferEvaluator, used to refine
 * crossings).
 */
import Complex from 'complex.js';
import { evalPoly, polyMul, polyRootsPlain, polySections, polyTrim, type Poly } from './complex-poly';
import type { TransferSummary } from './types';

const TWO_PI = 2 * Math.PI;

export interface SectionedTransfer {
  /** Real gain, sign included (the sign contributes 180° of phase). */
  readonly gain: number;
  /** Power of s: −1 for an integrator (pole at the origin), +1 for a zero at the origin. */
  readonly originOrder: number;
  /** Numerator sections, each [1, a1] or [1, a1, a2]. */
  readonly num: readonly Poly[];
  /** Denominator sections, each [1, a1] or [1, a1, a2]. */
  readonly den: readonly Poly[];
}

/**
 * Split an ascending polynomial into origin order, gain (lowest non-zero coefficient) and
 * one normalised section (degree ≤ 2 expected).
 */
const normalisePoly = (p: Poly): { order: number; gain: number; section: number[] | null } => {
  const t = polyTrim(p);
  let lo = 0;
  while (lo < t.length - 1 && t[lo] === 0) lo++;
  const g = t[lo];
  const m = t.length - lo;
  if (m > 3) throw new Error('normalisePoly: degree above 2 must be split into sections first');
  if (m === 1) return { order: lo, gain: g, section: null };
  // "+ 0" turns −0 into +0 (keeps atan2 on one branch).
  const section = m === 2 ? [1, t[lo + 1] / g + 0] : [1, t[lo + 1] / g + 0, t[lo + 2] / g + 0];
  return { order: lo, gain: g, section };
};

/** Build a sectioned transfer from numerator and denominator polynomials of degree ≤ 2. */
export const transferFromPolys = (num: Poly, den: Poly): SectionedTransfer => {
  const n = normalisePoly(num);
  const d = normalisePoly(den);
  return {
    gain: n.gain / d.gain,
    originOrder: n.order - d.order,
    num: n.section ? [n.section] : [],
    den: d.section ? [d.section] : [],
  };
};

/** Product of transfers: gains multiply, origin orders add, sections concatenate. */
export const multiplyTransfers = (...parts: SectionedTransfer[]): SectionedTransfer => {
  let gain = 1;
  let originOrder = 0;
  const num: Poly[] = [];
  const den: Poly[] = [];
  for (let i = 0; i < parts.length; i++) {
    const p = parts[i];
    gain *= p.gain;
    originOrder += p.originOrder;
    for (let k = 0; k < p.num.length; k++) num.push(p.num[k]);
    for (let k = 0; k < p.den.length; k++) den.push(p.den[k]);
  }
  return { gain, originOrder, num, den };
};

/** Multiply a transfer by a real constant. */
export const scaleTransfer = (h: SectionedTransfer, k: number): SectionedTransfer => ({ ...h, gain: h.gain * k });

/** Full numerator and denominator polynomials (ascending), for reading roots and for tests. */
export const transferPolys = (h: SectionedTransfer): { num: number[]; den: number[] } => {
  let num: number[] = [h.gain];
  let den: number[] = [1];
  for (const p of h.num) num = polyMul(num, p);
  for (const p of h.den) den = polyMul(den, p);
  const shift = (p: number[], k: number) => [...new Array<number>(k).fill(0), ...p];
  if (h.originOrder > 0) num = shift(num, h.originOrder);
  if (h.originOrder < 0) den = shift(den, -h.originOrder);
  return { num, den };
};

/** H(s) at any complex s (complex.js), for single-point use and tests. */
export const evaluateTransfer = (h: SectionedTransfer, s: Complex): Complex => {
  const { num, den } = transferPolys(h);
  return evalPoly(num, s).div(evalPoly(den, s));
};

/** Principal value of an angle in degrees, in (−180°, 180°]. */
export const wrapDeg = (deg: number): number => {
  const w = deg - 360 * Math.floor((deg + 180) / 360);
  return w === -180 ? 180 : w;
};

/**
 * Multiple of 360° that makes a continuous raw phase start at its principal value at the
 * first sweep frequency: offset = 360·round((wrap(raw₀) − raw₀)/360).
 */
export const phaseOffsetDeg = (rawAtStartDeg: number): number =>
  360 * Math.round((wrapDeg(rawAtStartDeg) - rawAtStartDeg) / 360);

/** 10·log10(x) = DB_PER_LN_MAGSQ·ln(x); Math.log is markedly faster than Math.log10 in V8. */
export const DB_PER_LN_MAGSQ = 10 / Math.LN10;

/** 20·log10|H| from |H|², as (10/ln 10)·ln|H|². */
export const dbFromMagSq = (magSq: number): number => DB_PER_LN_MAGSQ * Math.log(magSq);

/** 20·log10(x) for a magnitude x. */
export const dbFromMag = (mag: number): number => 20 * Math.log10(mag);

/**
 * Roots of one section [1, a1] or [1, a1, a2] (rad/s), pushed onto `out`: the closed forms of
 * the engine's root finder (polyRootsPlain: real roots first, then a pair with im > 0 first),
 * inline because every summary of every analysis reads them.
 */
const pushSectionRoots = (p: Poly, out: { re: number; im: number }[]): void => {
  const a1 = p.length > 1 ? p[1] : 0;
  const a2 = p.length > 2 ? p[2] : 0;
  if (a2 === 0) {
    if (a1 !== 0) out.push({ re: -1 / a1, im: 0 });
    else if (p.length > 3) for (const r of polyRootsPlain(p)) out.push(r);
    return;
  }
  if (p.length > 3) {
    for (const r of polyRootsPlain(p)) out.push(r);
    return;
  }
  const disc = a1 * a1 - 4 * a2;
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    const q = -0.5 * (a1 + (a1 >= 0 ? sq : -sq));
    out.push({ re: q / a2, im: 0 }, { re: 1 / q, im: 0 });
    return;
  }
  const re = -a1 / (2 * a2);
  const im = Math.sqrt(-disc) / (2 * Math.abs(a2));
  out.push({ re, im }, { re, im: -im });
};

/** Poles and zeros of a sectioned transfer (rad/s), origin roots included as 0. */
export const transferRoots = (h: SectionedTransfer): { zeros: { re: number; im: number }[]; poles: { re: number; im: number }[] } => {
  const zeros: { re: number; im: number }[] = [];
  const poles: { re: number; im: number }[] = [];
  for (let k = 0; k < h.originOrder; k++) zeros.push({ re: 0, im: 0 });
  for (let k = 0; k < -h.originOrder; k++) poles.push({ re: 0, im: 0 });
  for (const p of h.num) pushSectionRoots(p, zeros);
  for (const p of h.den) pushSectionRoots(p, poles);
  return { zeros, poles };
};

/** |root| in Hz, ascending (insertion sort: a handful of roots, no comparator call per pair). */
const sortedHz = (roots: readonly { re: number; im: number }[]): number[] => {
  const out: number[] = [];
  for (let k = 0; k < roots.length; k++) {
    const r = roots[k];
    const hz = Math.sqrt(r.re * r.re + r.im * r.im) / TWO_PI;
    let j = out.length;
    out.push(hz);
    while (j > 0 && out[j - 1] > hz) {
      out[j] = out[j - 1];
      j--;
    }
    out[j] = hz;
  }
  return out;
};

/**
 * Landmarks of a transfer, frequencies in Hz.
 * - dcGainDb: 20·log10|H(0)|; null when H has a zero or pole at the origin.
 * - resonanceHz, q: of the first complex-capable (degree-2) denominator section
 *   1 + s/(Qω0) + s²/ω0²: ω0 = 1/√a2, Q = √a2/a1.
 * - esrZeroHz: the left-half-plane real zero nearest (in log) to 1/(2π·rc·C), when given.
 * - rhpZeroHz: the lowest right-half-plane real zero, else null.
 */
export const summarizeTransfer = (h: SectionedTransfer, esrHint: number | null = null): TransferSummary => {
  const { zeros, poles } = transferRoots(h);
  const quad = h.den.find((p) => p.length === 3 && p[2] > 0);
  const resonanceHz = quad ? 1 / (TWO_PI * Math.sqrt(quad[2])) : null;
  const q = quad && quad[1] > 0 ? Math.sqrt(quad[2]) / quad[1] : null;
  let esrZeroHz: number | null = null;
  let rhpZeroHz: number | null = null;
  for (const z of zeros) {
    if (z.im !== 0 || z.re === 0) continue;
    const f = Math.abs(z.re) / TWO_PI;
    if (z.re > 0) rhpZeroHz = rhpZeroHz === null ? f : Math.min(rhpZeroHz, f);
    else if (esrHint !== null && (esrZeroHz === null || Math.abs(Math.log(f / esrHint)) < Math.abs(Math.log(esrZeroHz / esrHint)))) esrZeroHz = f;
  }
  return {
    dcGainDb: h.originOrder === 0 ? dbFromMag(Math.abs(h.gain)) : null,
    resonanceHz,
    q,
    esrZeroHz,
    rhpZeroHz,
    polesHz: sortedHz(poles),
    zerosHz: sortedHz(zeros),
  };
};

/**
 * A real polynomial of any degree (ascending) as origin order, gain and sections of degree
 * ≤ 2 with constant term 1, from its roots: a real root r gives [1, −1/r], a complex pair
 * r, r̄ gives [1, −2·Re r/|r|², 1/|r|²]. For models whose polynomials exceed degree 2
 * (current-mode plant, finite op-amp); the roots are found once per model, not per point.
 */
const sectionsOfPoly = (p: Poly): { order: number; gain: number; sections: number[][] } => {
  const t = polyTrim(p);
  if (t.length <= 3) {
    const n = normalisePoly(t);
    return { order: n.order, gain: n.gain, sections: n.section ? [n.section] : [] };
  }
  let lo = 0;
  while (lo < t.length - 1 && t[lo] === 0) lo++;
  const gain = t[lo];
  const sections = polySections(t.slice(lo));
  return { order: lo, gain, sections };
};

/** Sum of two ascending polynomials. */
export const polyAdd = (a: Poly, b: Poly): number[] => {
  const out: number[] = [];
  for (let k = Math.max(a.length, b.length); k > 0; k--) out.push(0);
  for (let i = 0; i < a.length; i++) out[i] += a[i];
  for (let i = 0; i < b.length; i++) out[i] += b[i];
  return out;
};

/** Sectioned transfer from numerator and denominator polynomials of any degree. */
export const transferFromAnyPolys = (num: Poly, den: Poly): SectionedTransfer => {
  const n = sectionsOfPoly(num);
  const d = sectionsOfPoly(den);
  return { gain: n.gain / d.gain, originOrder: n.order - d.order, num: n.sections, den: d.sections };
};

/**
 * sup over ω ≥ 0 of |S'(jω) − S(jω)| / |S(jω)| for sections S = 1 + a1·s + a2·s² and S'
 * (either may be first order): with x = ω², the square is (A·x + B·x²)/(1 + C·x + D·x²),
 * A = Δa1², B = Δa2², C = a1² − 2a2, D = a2², whose stationary points solve
 * (BC − AD)·x² + 2B·x + A = 0; the supremum is there or at x → ∞. Null when unbounded (S
 * vanishes on the jω axis, or S' rises faster).
 */
const sectionDeparture = (a: Poly, b: Poly): number | null => {
  const a1 = a.length > 1 ? a[1] : 0;
  const a2 = a.length > 2 ? a[2] : 0;
  const da1 = (b.length > 1 ? b[1] : 0) - a1;
  const da2 = (b.length > 2 ? b[2] : 0) - a2;
  if (a1 === 0 && a2 > 0) return null;
  const A = da1 * da1;
  const B = da2 * da2;
  const C = a1 * a1 - 2 * a2;
  const D = a2 * a2;
  const f = (x: number) => (A * x + B * x * x) / (1 + C * x + D * x * x);
  let sup: number;
  if (D > 0) sup = B / D;
  else if (B > 0) return null;
  else if (C > 0) sup = A / C;
  else if (A === 0) sup = 0;
  else return null;
  const qa = B * C - A * D;
  const disc = 4 * B * B - 4 * qa * A;
  if (qa !== 0 && disc >= 0) {
    const sq = Math.sqrt(disc);
    for (const x of [(-2 * B + sq) / (2 * qa), (-2 * B - sq) / (2 * qa)]) if (x > 0 && Number.isFinite(x)) sup = Math.max(sup, f(x));
  }
  return Math.sqrt(Math.max(0, sup));
};

/**
 * Bounds on H'/H over all frequencies for two transfers of the same structure (e.g. a
 * compensator with its parts snapped): |20·log10|H'/H|| ≤ db and |∠(H'/H)| ≤ deg. Each pair
 * of corresponding sections departs by at most ε (sectionDeparture), so its ratio lies within
 * a factor 1 ± ε: |ln| ≤ −ln(1 − ε), angle ≤ asin ε. Null when the structures differ or a
 * section moves by half its size or more (then nothing useful is bounded).
 */
export const ratioBound = (h: SectionedTransfer, h2: SectionedTransfer): { db: number; deg: number } | null => {
  if (h.originOrder !== h2.originOrder || h.gain * h2.gain <= 0 || h.num.length !== h2.num.length || h.den.length !== h2.den.length) return null;
  let ln = Math.abs(Math.log(h2.gain / h.gain));
  let angle = 0;
  for (const [x, y] of [
    [h.num, h2.num],
    [h.den, h2.den],
  ] as const) {
    for (let k = 0; k < x.length; k++) {
      if (x[k].length !== y[k].length) return null;
      const e = sectionDeparture(x[k], y[k]);
      if (e === null || e >= 0.5) return null;
      ln -= Math.log(1 - e);
      angle += Math.asin(e);
    }
  }
  return { db: 2 * DB_PER_LN_MAGSQ * ln, deg: (angle * 180) / Math.PI };
};

