/**
 * Real polynomials on coefficient arrays: evaluation at s = jω, products and roots.
 *
 * Convention used throughout the engine: coefficients are in ASCENDING powers of s,
 * p = [p0, p1, p2, …] means p(s) = p0 + p1·s + p2·s² + ….
 * complex.js carries the complex values at the edges (roots, single-point evaluation);
 * the hot sweep loops in sweep.ts and the root finder's iteration work on plain re/im numbers.
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
  const out: number[] = [];
  for (let k = a.length + b.length - 1; k > 0; k--) out.push(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
};

/** Drop zero coefficients of the highest powers (keeps at least one coefficient). */
export const polyTrim = (p: Poly): Poly => {
  let n = p.length;
  while (n > 1 && p[n - 1] === 0) n--;
  // The array itself when nothing is trimmed (the common case): no copy per factoring.
  return n === p.length ? p : p.slice(0, n);
};

/**
 * Roots of c0 + c1·x + c2·x² (c2 ≠ 0) as [re, im] pairs, without cancellation
 * (q = −(c1 + sign(c1)·√Δ)/2, x1 = q/c2, x2 = c0/q; Press et al., Numerical Recipes, 3rd ed., §5.6).
 */
const quadraticRoots = (c0: number, c1: number, c2: number): [number, number][] => {
  const disc = c1 * c1 - 4 * c2 * c0;
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    const q = -0.5 * (c1 + (c1 >= 0 ? sq : -sq));
    if (q === 0) return [[0, 0], [0, 0]];
    return [[q / c2, 0], [c0 / q, 0]];
  }
  const re = -c1 / (2 * c2);
  const im = Math.sqrt(-disc) / (2 * Math.abs(c2));
  return [[re, im], [re, -im]];
};

/**
 * Roots of the monic cubic x³ + b2·x² + b1·x + b0 (|b0| = 1 after rootPairs' scaling), times
 * σ. A real cubic has a real root: found by safeguarded Newton inside the Cauchy bound
 * |x| ≤ 1 + max|b_k| (Press et al., Numerical Recipes, 3rd ed., §9.4, rtsafe), then divided
 * out, forward when it is the smallest root in size (|r| ≤ 1 here) and backward otherwise,
 * the stable order (ibid. §9.5), leaving a quadratic solved in closed form. The current-mode
 * model factors three cubics per analysis; this takes a fraction of the simultaneous iteration.
 */
const cubicRoots = (b2: number, b1: number, b0: number, sigma: number): [number, number][] => {
  const bound = 1 + Math.max(Math.abs(b0), Math.abs(b1), Math.abs(b2));
  let lo = -bound;
  let hi = bound;
  let x = 0;
  for (let iter = 0; iter < 200; iter++) {
    const f = ((x + b2) * x + b1) * x + b0;
    if (f === 0) break;
    if (f < 0) lo = x;
    else hi = x;
    const df = (3 * x + 2 * b2) * x + b1;
    let next = x - f / df;
    // Bisect when Newton leaves the bracket (or the slope vanishes).
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    const step = next - x;
    x = next;
    if (Math.abs(step) <= 4e-16 * Math.abs(x) || hi - lo <= 4e-16 * Math.abs(x)) break;
  }
  const r = x;
  let c1: number;
  let c0: number;
  if (Math.abs(r) <= 1) {
    c1 = b2 + r;
    c0 = b1 + r * c1;
  } else {
    c0 = -b0 / r;
    c1 = (c0 - b1) / r;
  }
  const out: [number, number][] = [[r * sigma, 0]];
  for (const [re, im] of quadraticRoots(c0, c1, 1)) out.push([re * sigma, im * sigma]);
  return out;
};

/**
 * The engine's one root finder: every root of a real polynomial with p[0] ≠ 0 (ascending,
 * degree ≥ 1), as [re, im] pairs. Degree ≤ 2 in closed form; 3 by a real root and deflation
 * (cubicRoots); above, the Aberth–Ehrlich simultaneous iteration (O. Aberth, Math. Comp. 27
 * (1973) 339–344; L. W. Ehrlich, Comm. ACM 10 (1967) 107–108):
 * x_i ← x_i − N_i / (1 − N_i·Σ_{j≠i} 1/(x_i − x_j)), N_i = p(x_i)/p′(x_i), cubically
 * convergent for simple roots. The variable is scaled so the roots' geometric mean is 1, and
 * the iteration starts from the Newton polygon (below). It runs on plain numbers: it factors the
 * current-mode plant and the finite op-amp on every analysis, and with complex.js values each
 * call took about 15 times as long (measured on those polynomials); complex.js carries the
 * roots it returns (polyRoots).
 */
const rootPairs = (p: Poly): [number, number][] => {
  const t = polyTrim(p);
  const n = t.length - 1;
  if (n <= 0) return [];
  if (n === 1) return [[-t[0] / t[1], 0]];
  if (n === 2) return quadraticRoots(t[0], t[1], t[2]);
  const sigma = Math.pow(Math.abs(t[0] / t[n]), 1 / n);
  // In x = s/σ: q[k] = t[k]·σ^k / t[0], so q[0] = 1 and |q[n]| = 1.
  const q = new Array<number>(n + 1);
  for (let k = 0, sk = 1 / t[0]; k <= n; k++, sk *= sigma) q[k] = t[k] * sk;
  if (n === 3) return cubicRoots(q[2] / q[3], q[1] / q[3], q[0] / q[3], sigma);
  // Starting points from the Newton polygon (D. A. Bini, "Numerical computation of polynomial
  // zeros by means of Aberth's method", Numer. Algorithms 13 (1996) 179–200, §3): the upper
  // convex hull of (k, ln|q_k|); an edge from k_i to k_j carries k_j − k_i starts on the circle
  // of radius (|q_{k_i}|/|q_{k_j}|)^(1/(k_j − k_i)). Roots that lie decades apart (a finite
  // op-amp's poles) then start near their own size, and the iteration needs a few steps
  // instead of a dozen from the unit circle.
  const re = new Array<number>(n);
  const im = new Array<number>(n);
  const hull: number[] = [];
  for (let k = 0; k <= n; k++) {
    if (q[k] === 0) continue;
    const lk = Math.log(Math.abs(q[k]));
    while (hull.length >= 2) {
      const a = hull[hull.length - 2];
      const b = hull[hull.length - 1];
      const la = Math.log(Math.abs(q[a]));
      const lb = Math.log(Math.abs(q[b]));
      // Drop b when it lies on or below the chord from a to k.
      if ((lb - la) * (k - a) <= (lk - la) * (b - a)) hull.pop();
      else break;
    }
    hull.push(k);
  }
  for (let h = 0, j = 0; h + 1 < hull.length; h++) {
    const a = hull[h];
    const b = hull[h + 1];
    const m = b - a;
    const u = Math.pow(Math.abs(q[a] / q[b]), 1 / m);
    for (let i = 0; i < m; i++, j++) {
      const ang = (2 * Math.PI * i) / m + (2 * Math.PI * h) / n + 0.4;
      re[j] = u * Math.cos(ang);
      im[j] = u * Math.sin(ang);
    }
  }
  const done = new Array<boolean>(n).fill(false);
  for (let iter = 0, active = n; iter < 100 && active > 0; iter++) {
    active = 0;
    for (let i = 0; i < n; i++) {
      if (done[i]) continue;
      const xr = re[i];
      const xi = im[i];
      // p(x) and p′(x) by Horner.
      let pr = q[n];
      let pi = 0;
      let dr = 0;
      let di = 0;
      for (let k = n - 1; k >= 0; k--) {
        const ndr = dr * xr - di * xi + pr;
        di = dr * xi + di * xr + pi;
        dr = ndr;
        const npr = pr * xr - pi * xi + q[k];
        pi = pr * xi + pi * xr;
        pr = npr;
      }
      const dd = dr * dr + di * di;
      if (dd === 0) {
        // A stationary point: nudge off it.
        re[i] += 1e-3 * (1 + Math.abs(xr));
        active++;
        continue;
      }
      // N = p/p′
      const nr = (pr * dr + pi * di) / dd;
      const ni = (pi * dr - pr * di) / dd;
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const ar = xr - re[j];
        const ai = xi - im[j];
        const aa = ar * ar + ai * ai;
        sr += ar / aa;
        si -= ai / aa;
      }
      // w = N / (1 − N·S)
      const br = 1 - (nr * sr - ni * si);
      const bi = -(nr * si + ni * sr);
      const bb = br * br + bi * bi;
      const wr = (nr * br + ni * bi) / bb;
      const wi = (ni * br - nr * bi) / bb;
      re[i] = xr - wr;
      im[i] = xi - wi;
      // Cubic convergence: a step below 1e-11 of the root leaves an error far below rounding.
      if (wr * wr + wi * wi <= 1e-22 * (re[i] * re[i] + im[i] * im[i]) || !Number.isFinite(wr + wi)) done[i] = true;
      else active++;
    }
  }
  const out: [number, number][] = [];
  for (let k = 0; k < n; k++) out.push([re[k] * sigma, im[k] * sigma]);
  return out;
};

/**
 * The roots as real roots and complex pairs (one of each pair, im > 0). A root whose imaginary
 * part is within 1e-7 of its size is real (a double real root comes out of the iteration with
 * an imaginary part of order √ε); each other root takes its nearest conjugate as partner, so
 * the degree is kept whatever the rounding.
 */
const classifyRoots = (roots: [number, number][]): { real: number[]; pairs: [number, number][] } => {
  const real: number[] = [];
  const pairs: [number, number][] = [];
  const left: [number, number][] = [];
  for (let k = 0; k < roots.length; k++) {
    const x = roots[k];
    if (x[1] * x[1] > 1e-14 * (x[0] * x[0] + x[1] * x[1])) left.push(x);
    else real.push(x[0]);
  }
  // Largest imaginary part first (insertion sort: at most a few roots; no comparator closure
  // on this path, which runs for every factored polynomial of every analysis).
  for (let a = 1; a < left.length; a++) {
    const x = left[a];
    let b = a - 1;
    while (b >= 0 && Math.abs(left[b][1]) < Math.abs(x[1])) {
      left[b + 1] = left[b];
      b--;
    }
    left[b + 1] = x;
  }
  // Each takes the nearest conjugate of what is left.
  const used: boolean[] = [];
  for (let a = 0; a < left.length; a++) used.push(false);
  for (let a = 0; a < left.length; a++) {
    if (used[a]) continue;
    used[a] = true;
    const r = left[a][0];
    const i = left[a][1];
    let best = -1;
    let bestGap = Infinity;
    for (let b = a + 1; b < left.length; b++) {
      if (used[b]) continue;
      const dr = left[b][0] - r;
      const di = left[b][1] + i;
      const gap = dr * dr + di * di;
      if (gap < bestGap) {
        best = b;
        bestGap = gap;
      }
    }
    if (best < 0) {
      real.push(r);
      continue;
    }
    used[best] = true;
    pairs.push([(r + left[best][0]) / 2, (Math.abs(i) + Math.abs(left[best][1])) / 2]);
  }
  return { real, pairs };
};

/**
 * All roots of a real polynomial (ascending coefficients) as plain { re, im }: real roots,
 * then each complex pair (im > 0 first). Zero roots from vanishing low-order coefficients are
 * returned exactly as 0. Plain numbers because landmarks are read from every section of every
 * analysis; polyRoots gives the same roots as complex.js values.
 */
export const polyRootsPlain = (p: Poly): { re: number; im: number }[] => {
  const t = polyTrim(p);
  const roots: { re: number; im: number }[] = [];
  let lo = 0;
  while (lo < t.length - 1 && t[lo] === 0) {
    roots.push({ re: 0, im: 0 });
    lo++;
  }
  const { real, pairs } = classifyRoots(rootPairs(lo === 0 ? t : t.slice(lo)));
  for (const r of real) roots.push({ re: r, im: 0 });
  for (const [r, i] of pairs) roots.push({ re: r, im: i }, { re: r, im: -i });
  return roots;
};

/** All roots of a real polynomial (ascending coefficients), as complex.js values (see polyRootsPlain). */
export const polyRoots = (p: Poly): Complex[] => polyRootsPlain(p).map((r) => new Complex(r.re, r.im));

/** Polynomial with the given real roots and p(0) = 1: Π (1 − s/r). Roots must be non-zero. */
export const polyFromRealRoots = (roots: readonly number[]): number[] =>
  roots.reduce<number[]>((acc, r) => polyMul(acc, [1, -1 / r]), [1]);

/**
 * Sections of a real polynomial with no root at the origin (ascending, p[0] ≠ 0): factors
 * [1, a1] and [1, a1, a2] (the latter only for complex pairs) whose product is p/p[0], from
 * its roots: a real root r gives [1, −1/r], a pair r, r̄ gives [1, −2·Re r/|r|², 1/|r|²].
 */
export const polySections = (p: Poly): number[][] => {
  const t = polyTrim(p);
  if (t.length <= 1) return [];
  const { real, pairs } = classifyRoots(rootPairs(t));
  const out: number[][] = real.map((r) => [1, -1 / r + 0]);
  for (const [r, i] of pairs) {
    const m2 = r * r + i * i;
    out.push([1, (-2 * r) / m2 + 0, 1 / m2]);
  }
  return out;
};
