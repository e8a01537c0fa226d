/**
 * State-space realizations of sectioned transfers, for the time-domain simulations.
 *
 * H(s) = (b_n s^n + … + b_0)/(s^n + a_{n−1} s^{n−1} + … + a_0) in observable canonical form
 * (Kailath, Linear Systems, 1980, §2.1; any state-space text):
 *   x1' = −a_0·x_n + (b_0 − a_0·b_n)·u
 *   xk' = x_{k−1} − a_{k−1}·x_n + (b_{k−1} − a_{k−1}·b_n)·u   (k = 2…n)
 *   y   = x_n + b_n·u
 * Poles at the origin (a_0 = 0, the compensator's integrator) need no special case.
 * The canonical form of a transfer with time constants of microseconds is badly scaled;
 * the simulations balance the assembled matrix before taking exponentials (balance()).
 */
import { transferPolys, type SectionedTransfer } from './transfer';

export interface StateSpace {
  n: number;
  /** n×n, row-major. */
  a: number[];
  b: number[];
  c: number[];
  d: number;
}

/** Observable canonical realization of a proper transfer. @throws Error for an improper one. */
export const realizeTransfer = (h: SectionedTransfer): StateSpace => {
  const { num, den } = transferPolys(h);
  let dn = den.length - 1;
  while (dn > 0 && den[dn] === 0) dn--;
  let nn = num.length - 1;
  while (nn > 0 && num[nn] === 0) nn--;
  if (nn > dn) throw new Error('realizeTransfer: improper transfer (more zeros than poles)');
  const lead = den[dn];
  const a = den.slice(0, dn).map((v) => v / lead);
  const b = Array.from({ length: dn + 1 }, (_, k) => (num[k] ?? 0) / lead);
  const n = dn;
  const bn = b[n];
  const A = new Array<number>(n * n).fill(0);
  const B = new Array<number>(n).fill(0);
  const C = new Array<number>(n).fill(0);
  for (let k = 0; k < n; k++) {
    if (k > 0) A[k * n + (k - 1)] = 1;
    A[k * n + (n - 1)] = -a[k];
    B[k] = b[k] - a[k] * bn;
  }
  if (n > 0) C[n - 1] = 1;
  return { n, a: A, b: B, c: C, d: bn };
};

/**
 * Diagonal similarity D⁻¹·A·D with powers of two that makes each state's row and column
 * norms comparable (Parlett & Reinsch, Numer. Math. 13, 1969), so that the exponential of a
 * loop mixing 1e−3 s and 1e−7 s time constants keeps its accuracy. Returns the scales d
 * (x = D·x̃); A is modified in place.
 */
export const balance = (a: Float64Array, n: number): Float64Array => {
  const d = new Float64Array(n).fill(1);
  const radix = 2;
  let converged = false;
  for (let iter = 0; iter < 100 && !converged; iter++) {
    converged = true;
    for (let i = 0; i < n; i++) {
      let c = 0;
      let r = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        c += Math.abs(a[j * n + i]);
        r += Math.abs(a[i * n + j]);
      }
      if (c === 0 || r === 0) continue;
      let f = 1;
      const s = c + r;
      let cc = c;
      let rr = r;
      while (cc < rr / radix) {
        cc *= radix;
        rr /= radix;
        f *= radix;
      }
      while (cc >= rr * radix) {
        cc /= radix;
        rr *= radix;
        f /= radix;
      }
      if ((cc + rr) / f < 0.95 * s) {
        converged = false;
        d[i] *= f;
        for (let j = 0; j < n; j++) a[i * n + j] /= f;
        for (let j = 0; j < n; j++) a[j * n + i] *= f;
      }
    }
  }
  return d;
};

/** The same system in balanced coordinates x = D·x̃: (D⁻¹AD, D⁻¹B, C·D, d); `scale` is D. */
export const balanceRealization = (ss: StateSpace): StateSpace & { scale: Float64Array } => {
  const a = Float64Array.from(ss.a);
  const scale = balance(a, ss.n);
  return {
    n: ss.n,
    a: Array.from(a),
    b: ss.b.map((v, i) => v / scale[i]),
    c: ss.c.map((v, i) => v * scale[i]),
    d: ss.d,
    scale,
  };
};

/**
 * Equilibrium of an observable canonical realization whose denominator has a_0 = 0 (an
 * integrator), with zero input and output y: x_{k−1} = a_k·y (k = 1…n−1), x_{n−1} = y.
 * Returns null without an integrator (the equilibrium is then x = 0 only).
 */
export const integratorEquilibrium = (ss: StateSpace, y: number): number[] | null => {
  const n = ss.n;
  if (n === 0 || ss.a[n - 1] !== 0) return null; // −a_0 sits in row 0, column n−1
  const x = new Array<number>(n).fill(0);
  for (let k = 1; k < n; k++) x[k - 1] = -ss.a[k * n + (n - 1)] * y;
  x[n - 1] = y;
  return x;
};
