/**
 * Small dense matrices (row-major Float64Array, n×n) and the matrix exponential, for the
 * time-domain simulations: every linear interval is integrated exactly as x(t) = e^{Mt}·x(0)
 * on an augmented state (inputs that are constant or ramp within the interval are states).
 *
 * e^{A} by scaling and squaring with the diagonal Padé approximant of degree 6
 * (Moler & Van Loan, "Nineteen dubious ways to compute the exponential of a matrix",
 * SIAM Review 2003, method 3): A is scaled by 2^−s so that ‖A/2^s‖∞ ≤ 1/2, where the
 * [6/6] approximant's relative error is below 1e−16, then squared s times.
 */

export type Mat = Float64Array;

export const zeros = (n: number): Mat => new Float64Array(n * n);

export const identity = (n: number): Mat => {
  const m = zeros(n);
  for (let i = 0; i < n; i++) m[i * n + i] = 1;
  return m;
};

/** C = A·B (n×n). */
export const matMul = (a: Mat, b: Mat, n: number, out: Mat = zeros(n)): Mat => {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += a[ri + k] * b[k * n + j];
      out[ri + j] = s;
    }
  }
  return out;
};

/** y = A·x. */
export const matVec = (a: Mat, x: ArrayLike<number>, n: number, out: Float64Array = new Float64Array(n)): Float64Array => {
  for (let i = 0; i < n; i++) {
    let s = 0;
    const ri = i * n;
    for (let k = 0; k < n; k++) s += a[ri + k] * x[k];
    out[i] = s;
  }
  return out;
};

const normInf = (a: Mat, n: number): number => {
  let best = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.abs(a[i * n + j]);
    if (s > best) best = s;
  }
  return best;
};

/** Solve A·X = B for X (n×n each) by LU with partial pivoting; A and B are overwritten. */
export const solveInPlace = (a: Mat, b: Mat, n: number): Mat => {
  for (let k = 0; k < n; k++) {
    let p = k;
    let max = Math.abs(a[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * n + k]);
      if (v > max) {
        max = v;
        p = i;
      }
    }
    if (max === 0) throw new Error('solveInPlace: singular matrix');
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = a[k * n + j];
        a[k * n + j] = a[p * n + j];
        a[p * n + j] = t;
        const u = b[k * n + j];
        b[k * n + j] = b[p * n + j];
        b[p * n + j] = u;
      }
    }
    const pivot = a[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const f = a[i * n + k] / pivot;
      if (f === 0) continue;
      for (let j = k; j < n; j++) a[i * n + j] -= f * a[k * n + j];
      for (let j = 0; j < n; j++) b[i * n + j] -= f * b[k * n + j];
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const pivot = a[k * n + k];
    for (let j = 0; j < n; j++) {
      let s = b[k * n + j];
      for (let i = k + 1; i < n; i++) s -= a[k * n + i] * b[i * n + j];
      b[k * n + j] = s / pivot;
    }
  }
  return b;
};

/** Padé [6/6] coefficients c_k = (12−k)!·6! / (12!·k!·(6−k)!). */
const PADE6 = (() => {
  const fact = (k: number): number => (k <= 1 ? 1 : k * fact(k - 1));
  return Array.from({ length: 7 }, (_, k) => (fact(12 - k) * fact(6)) / (fact(12) * fact(k) * fact(6 - k)));
})();

/** e^{A·t} for an n×n matrix A (A itself is not modified). */
export const expm = (a: Mat, n: number, t = 1): Mat => {
  const norm = normInf(a, n) * Math.abs(t);
  const s = norm > 0.5 ? Math.max(0, Math.ceil(Math.log2(norm / 0.5))) : 0;
  const scale = t / 2 ** s;
  const x = zeros(n);
  for (let i = 0; i < n * n; i++) x[i] = a[i] * scale;
  // N = Σ c_k X^k, D = Σ (−1)^k c_k X^k
  const num = identity(n);
  const den = identity(n);
  let power = identity(n);
  for (let k = 1; k <= 6; k++) {
    power = matMul(power, x, n);
    const c = PADE6[k];
    const sign = k % 2 === 0 ? 1 : -1;
    for (let i = 0; i < n * n; i++) {
      num[i] += c * power[i];
      den[i] += sign * c * power[i];
    }
  }
  let e = solveInPlace(den, num, n);
  for (let k = 0; k < s; k++) e = matMul(e, e, n);
  return e;
};
