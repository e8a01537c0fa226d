/**
 * Real polynomials on coefficient arrays: evaluation at s = jω, products and roots.
 *
 * Convention used throughout the engine: coefficients are in ASCENDING powers of s,
 * p = [p0, p1, p2, …] means p(s) = p0 + p1·s + p2·s² + ….
 * complex.js carries the complex values at the edges (roots, single-point evaluation);
 * the hot sweep loops in sweep.ts work on plain re/im numbers.
 */
import Complex from 'complex.js';

/** Ascending coefficients: p(s) = Σ p[k]·s^k. */
export type Poly = readonly number[];

/**
 * Evaluate p(jω) by Horner's rule on plain numbers.
 *
 * @param p ascending coefficients
 * @param omega angular frequency ω, rad/s
 * @returns [re, im] of p(jω)
 */
export const evalPolyJw = (p: Poly, omega: number): [number, number] => {
  let re = 0;
  let im = 0;
  for (let k = p.length - 1; k >= 0; k--) {
    // (re + j·im)·(jω) + p[k]
    const nre = -im * omega + p[k];
    im = re * omega;
    re = nre;
  }
  return [re, im];
};

/** Evaluate p(s) at any complex s by Horner's rule (complex.js). */
export const evalPoly = (p: Poly, s: Complex): Complex => {
  let acc = new Complex(0, 0);
  for (let k = p.length - 1; k >= 0; k--) acc = acc.mul(s).add(p[k]);
  return acc;
};

/** Product of two polynomials (ascending coefficients). */
export const polyMul = (a: Poly, b: Poly): number[] => {
  if (a.length === 0 || b.length === 0) return [];
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
};

/** Drop zero coefficients of the highest powers (keeps at least one coefficient). */
export const polyTrim = (p: Poly): number[] => {
  let n = p.length;
  while (n > 1 && p[n - 1] === 0) n--;
  return p.slice(0, n);
};

/**
 * Roots of c0 + c1·x + c2·x² (c2 ≠ 0), computed without cancellation
 * (q = −(c1 + sign(c1)·√Δ)/2, x1 = q/c2, x2 = c0/q).
 */
const quadraticRoots = (c0: number, c1: number, c2: number): Complex[] => {
  const disc = c1 * c1 - 4 * c2 * c0;
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    const q = -0.5 * (c1 + (c1 >= 0 ? sq : -sq));
    if (q === 0) return [new Complex(0, 0), new Complex(0, 0)];
    return [new Complex(q / c2, 0), new Complex(c0 / q, 0)];
  }
  const re = -c1 / (2 * c2);
  const im = Math.sqrt(-disc) / (2 * Math.abs(c2));
  return [new Complex(re, im), new Complex(re, -im)];
};

/**
 * Durand–Kerner iteration for a monic-normalised polynomial of any degree.
 * Used for degree ≥ 3; closed forms cover degree ≤ 2.
 */
const durandKerner = (p: number[]): Complex[] => {
  const n = p.length - 1;
  const lead = p[n];
  const monic = p.map((c) => c / lead);
  // Starting points on a circle of the Cauchy bound radius, off the real axis.
  const radius = 1 + Math.max(...monic.slice(0, n).map(Math.abs));
  let z: Complex[] = Array.from({ length: n }, (_, k) =>
    new Complex({ abs: radius, arg: (2 * Math.PI * k) / n + 0.4 }),
  );
  for (let iter = 0; iter < 500; iter++) {
    let moved = 0;
    const next = z.map((zi, i) => {
      let den = new Complex(1, 0);
      z.forEach((zj, j) => {
        if (j !== i) den = den.mul(zi.sub(zj));
      });
      const step = evalPoly(monic, zi).div(den);
      moved = Math.max(moved, step.abs() / Math.max(1, zi.abs()));
      return zi.sub(step);
    });
    z = next;
    if (moved < 1e-15) break;
  }
  // Snap tiny imaginary parts of real roots.
  return z.map((r) => (Math.abs(r.im) <= 1e-12 * Math.max(1, r.abs()) ? new Complex(r.re, 0) : r));
};

/**
 * All roots of a real polynomial (ascending coefficients). Zero roots from
 * vanishing low-order coefficients are returned exactly as 0.
 */
export const polyRoots = (p: Poly): Complex[] => {
  const t = polyTrim(p);
  const roots: Complex[] = [];
  let lo = 0;
  while (lo < t.length - 1 && t[lo] === 0) {
    roots.push(new Complex(0, 0));
    lo++;
  }
  const q = t.slice(lo);
  const n = q.length - 1;
  if (n === 1) roots.push(new Complex(-q[0] / q[1], 0));
  else if (n === 2) roots.push(...quadraticRoots(q[0], q[1], q[2]));
  else if (n > 2) roots.push(...durandKerner(q));
  return roots;
};

/** Polynomial with the given real roots and p(0) = 1: Π (1 − s/r). Roots must be non-zero. */
export const polyFromRealRoots = (roots: readonly number[]): number[] =>
  roots.reduce<number[]>((acc, r) => polyMul(acc, [1, -1 / r]), [1]);
