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

/**
 * Bairstow's method: one quadratic factor x² − r·x − s of a real polynomial (ascending
 * coefficients a, degree n ≥ 3), in real arithmetic. Returns the factor and the quotient
 * (ascending, degree n − 2), or null when it does not converge from the given start.
 */
const bairstowStep = (a: readonly number[], r0: number, s0: number): { r: number; s: number; quotient: number[] } | null => {
  const n = a.length - 1;
  const b = new Array<number>(n + 1).fill(0);
  const c = new Array<number>(n + 1).fill(0);
  let r = r0;
  let s = s0;
  for (let iter = 0; iter < 100; iter++) {
    b[n] = a[n];
    b[n - 1] = a[n - 1] + r * b[n];
    for (let i = n - 2; i >= 0; i--) b[i] = a[i] + r * b[i + 1] + s * b[i + 2];
    c[n] = b[n];
    c[n - 1] = b[n - 1] + r * c[n];
    for (let i = n - 2; i >= 1; i--) c[i] = b[i] + r * c[i + 1] + s * c[i + 2];
    const det = c[2] * c[2] - c[3] * c[1];
    if (det === 0 || !Number.isFinite(det)) return null;
    const dr = (-b[1] * c[2] + b[0] * c[3]) / det;
    const ds = (-b[0] * c[2] + b[1] * c[1]) / det;
    r += dr;
    s += ds;
    if (Math.abs(dr) <= 1e-14 * Math.max(1, Math.abs(r)) && Math.abs(ds) <= 1e-14 * Math.max(1, Math.abs(s))) {
      // Quotient with the converged factor.
      b[n] = a[n];
      b[n - 1] = a[n - 1] + r * b[n];
      for (let i = n - 2; i >= 2; i--) b[i] = a[i] + r * b[i + 1] + s * b[i + 2];
      return { r, s, quotient: b.slice(2, n + 1) };
    }
  }
  return null;
};

/**
 * Sections of a real polynomial with no root at the origin (ascending, p[0] ≠ 0): factors
 * [1, a1] and [1, a1, a2] (the latter only for complex pairs) whose product is p/p[0].
 * The variable is scaled so the roots' geometric mean is 1, then quadratic factors are split
 * off by Bairstow's method (real arithmetic, fast); Durand–Kerner is the fallback.
 */
export const polySections = (p: Poly): number[][] => {
  const t = polyTrim(p);
  const n = t.length - 1;
  if (n <= 0) return [];
  const sigma = Math.pow(Math.abs(t[0] / t[n]), 1 / n);
  // q(x) = p(σ·x)/p(0): ascending, q[0] = 1.
  let q = t.map((c, k) => (c * Math.pow(sigma, k)) / t[0]);
  const out: number[][] = [];
  /** A factor x² − r·x − s of q, as sections in s (= σ·x). */
  const pushQuadratic = (r: number, s: number) => {
    // x² − r·x − s = −s·(1 − (r/−s)... ): roots of x² − r·x − s.
    const disc = r * r + 4 * s;
    if (disc >= 0) {
      const sq = Math.sqrt(disc);
      const x1 = 0.5 * (r + (r >= 0 ? sq : -sq));
      const x2 = x1 !== 0 ? -s / x1 : 0;
      for (const x of [x1, x2]) out.push([1, -1 / (x * sigma) + 0]);
    } else {
      // −s = |x|², r = 2·Re x: (1 − s/x)(1 − s/x̄) in s = σx → [1, −r/(−s·σ), 1/(−s·σ²)]
      const m2 = -s;
      out.push([1, -r / (m2 * sigma) + 0, 1 / (m2 * sigma * sigma)]);
    }
  };
  if (q.length === 4) {
    // Cubic: its real root in closed form (Cardano, or the trigonometric form for three real
    // roots), polished by Newton, then the quadratic left after deflation.
    const [d0, c0, b0] = [q[0] / q[3], q[1] / q[3], q[2] / q[3]];
    const p3 = c0 - (b0 * b0) / 3;
    const q3 = (2 * b0 * b0 * b0) / 27 - (b0 * c0) / 3 + d0;
    const disc = (q3 * q3) / 4 + (p3 * p3 * p3) / 27;
    let x: number;
    if (disc > 0) {
      const sq = Math.sqrt(disc);
      x = Math.cbrt(-q3 / 2 + sq) + Math.cbrt(-q3 / 2 - sq) - b0 / 3;
    } else {
      const m = 2 * Math.sqrt(-p3 / 3);
      const arg = Math.max(-1, Math.min(1, ((3 * q3) / (p3 * m)) ));
      x = m * Math.cos(Math.acos(arg) / 3) - b0 / 3;
    }
    for (let k = 0; k < 3; k++) {
      const f = ((x + b0) * x + c0) * x + d0;
      const df = (3 * x + 2 * b0) * x + c0;
      if (df === 0) break;
      x -= f / df;
    }
    if (x !== 0 && Number.isFinite(x)) {
      out.push([1, -1 / (x * sigma) + 0]);
      // x² + (b + x)·x + (c + x(b + x)) = x² − r·x − s
      pushQuadratic(-(b0 + x), -(c0 + x * (b0 + x)));
      return out;
    }
  }
  while (q.length - 1 > 2) {
    let step: ReturnType<typeof bairstowStep> = null;
    for (const [r0, s0] of [
      [0.1, -1],
      [-1.5, -0.7],
      [1, 0.5],
      [-0.2, -2],
    ]) {
      step = bairstowStep(q, r0, s0);
      if (step) break;
    }
    if (!step) break;
    pushQuadratic(step.r, step.s);
    q = step.quotient;
  }
  if (q.length - 1 > 2) {
    // Fallback: the roots of what is left, by Durand–Kerner.
    const roots = polyRoots(q);
    for (const r of roots) {
      if (Math.abs(r.im) <= 1e-7 * Math.abs(r.re)) out.push([1, -1 / (r.re * sigma) + 0]);
      else if (r.im > 0) {
        const m2 = r.re * r.re + r.im * r.im;
        out.push([1, (-2 * r.re) / (m2 * sigma) + 0, 1 / (m2 * sigma * sigma)]);
      }
    }
    return out;
  }
  const nq = q.length - 1;
  if (nq === 1) out.push([1, q[1] / q[0] / sigma + 0]);
  else if (nq === 2) {
    // q0 + q1 x + q2 x²: as a monic factor x² − r x − s with r = −q1/q2, s = −q0/q2.
    pushQuadratic(-q[1] / q[2], -q[0] / q[2]);
  }
  return out;
};
