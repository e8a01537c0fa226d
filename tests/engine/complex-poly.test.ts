import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { evalPoly, evalPolyJw, polyFromRealRoots, polyMul, polyRoots, polySections, polyTrim } from '@/lib/engine/complex-poly';
import { expectRel } from './helpers';

const sortRoots = (r: Complex[]) => [...r].sort((a, b) => a.re - b.re || a.im - b.im);

describe('polynomials (ascending coefficients)', () => {
  it('evaluates p(jω) by Horner like the expanded sum', () => {
    const p = [3, -2, 0.5, 7];
    for (const w of [0, 0.3, 2, 50]) {
      const [re, im] = evalPolyJw(p, w);
      // p(jω) = 3 − 2jω − 0.5ω² − 7jω³
      expect(re).toBeCloseTo(3 - 0.5 * w * w, 9);
      expect(im).toBeCloseTo(-2 * w - 7 * w ** 3, 6);
      const c = evalPoly(p, new Complex(0, w));
      expect(c.re).toBeCloseTo(re, 9);
      expect(c.im).toBeCloseTo(im, 6);
    }
  });

  it('multiplies and trims', () => {
    expect(polyMul([1, 2], [3, 0, 1])).toEqual([3, 6, 1, 2]);
    expect(polyTrim([1, 2, 0, 0])).toEqual([1, 2]);
    expect(polyTrim([0])).toEqual([0]);
  });

  it('finds real and complex roots of quadratics without cancellation', () => {
    // (s + 1e-6)(s + 1e6): the small root must survive (naive formula loses it)
    const r = sortRoots(polyRoots(polyMul([1e-6, 1], [1e6, 1])));
    expectRel(r[0].re, -1e6, 1e-12);
    expectRel(r[1].re, -1e-6, 1e-12);
    const c = sortRoots(polyRoots([5, 2, 1])); // s² + 2s + 5: −1 ± 2j
    expect(c[0].re).toBeCloseTo(-1, 12);
    expect(Math.abs(c[0].im)).toBeCloseTo(2, 12);
  });

  it('finds roots at the origin and of cubics (Aberth–Ehrlich)', () => {
    const p = polyMul([0, 1], polyFromRealRoots([-3, 5, -7e3]));
    const r = sortRoots(polyRoots(p));
    expect(r.map((x) => Math.round(x.re * 1e6) / 1e6)).toEqual([-7000, -3, 0, 5]);
    r.forEach((x) => expect(Math.abs(x.im)).toBeLessThan(1e-9));
  });

  it('finds widely spread real and complex roots of a quintic to full precision', () => {
    // Poles as a current-mode plant and a finite op-amp give them: 20 Hz … 10 MHz, Q 0.7 and 3 pairs.
    const w = (hz: number) => 2 * Math.PI * hz;
    const pair = (hz: number, q: number) => [1, 1 / (q * w(hz)), 1 / w(hz) ** 2];
    const p = [pair(250e3, 0.7), pair(3e6, 3), [1, 1 / w(20)]].reduce((a, b) => polyMul(a, b), [2.5]);
    const r = sortRoots(polyRoots(p));
    expect(r).toHaveLength(5);
    const mags = r.map((x) => x.abs() / (2 * Math.PI)).sort((a, b) => a - b);
    [20, 250e3, 250e3, 3e6, 3e6].forEach((hz, k) => expectRel(mags[k], hz, 1e-12));
    for (const x of r) expect(evalPoly(p, x).abs() / evalPoly(p.map(Math.abs), new Complex(x.abs(), 0)).abs()).toBeLessThan(1e-13);
    // Conjugate pairs come out exactly conjugate.
    const upper = r.filter((x) => x.im > 0);
    for (const x of upper) expect(r.some((y) => y.re === x.re && y.im === -x.im)).toBe(true);
  });

  it('cubics (real root by safeguarded Newton, then deflation; Press et al., Numerical Recipes §9.4–9.5): full precision however the roots are spread', () => {
    const w = (hz: number) => 2 * Math.PI * hz;
    const pair = (hz: number, q: number) => [1, 1 / (q * w(hz)), 1 / w(hz) ** 2];
    // A current-mode plant's denominator: a load pole and the sampling pair at fsw/2, Qp from 0.2 to 20,
    // and cubics with three real roots, one of them in the right half plane.
    const cases: [number[], number[]][] = [];
    // Q 0.2 splits the pair into two real roots at 250 kHz·(1 ± √(1 − 4Q²))/(2Q).
    const split = [(250e3 * (1 - Math.sqrt(1 - 0.16))) / 0.4, (250e3 * (1 + Math.sqrt(1 - 0.16))) / 0.4];
    for (const load of [3, 80, 2e3]) {
      for (const q of [0.64, 2, 20]) cases.push([polyMul([1, 1 / w(load)], pair(250e3, q)), [load, 250e3, 250e3]]);
      cases.push([polyMul([1, 1 / w(load)], pair(250e3, 0.2)), [load, ...split]]);
    }
    cases.push([polyFromRealRoots([-w(10), w(4e4), -w(3e6)]), [10, 4e4, 3e6]]);
    cases.push([polyFromRealRoots([-w(1e3), -w(1.001e3), -w(9e5)]), [1e3, 1.001e3, 9e5]]);
    for (const [p, hz] of cases) {
      const r = polyRoots(p.map((c) => c * -3.7));
      expect(r).toHaveLength(3);
      const mags = r.map((x) => x.abs() / (2 * Math.PI)).sort((a, b) => a - b);
      hz.forEach((h, k) => expectRel(mags[k], h, 1e-9));
      for (const x of r) expect(evalPoly(p, x).abs() / evalPoly(p.map(Math.abs), new Complex(x.abs(), 0)).abs()).toBeLessThan(1e-13);
    }
  });

  it('keeps a double real root real and the degree whole', () => {
    const r = polyRoots(polyFromRealRoots([-1e4, -1e4, -3e2]));
    expect(r).toHaveLength(3);
    r.forEach((x) => expect(x.im).toBe(0));
    expect(r.map((x) => x.re).sort((a, b) => a - b).map((x) => Math.round(x))).toEqual([-10000, -10000, -300]);
  });
});

describe('polySections: a polynomial as sections of degree ≤ 2 (from its roots)', () => {
  const product = (sections: number[][]) => sections.reduce((a, b) => polyMul(a, b), [1]);

  it.each([
    ['a cubic with a real root and a complex pair', [[1, 1e-4], [1, 2e-7, 4e-13]]],
    ['a quartic with two complex pairs far apart', [[1, 3e-8, 1e-14], [1, 2e-5, 5e-10]]],
    ['a quintic with an RHP zero', [[1, -2e-6], [1, 1e-7], [1, 4e-9, 1e-15], [1, 1e-3]]],
  ])('%s: the sections multiply back to p/p(0)', (_name, sections) => {
    const p = product(sections).map((c) => c * 7.5);
    const got = polySections(p);
    expect(got.reduce((n, s) => n + s.length - 1, 0)).toBe(p.length - 1);
    const back = product(got);
    back.forEach((c, k) => expectRel(c, p[k] / p[0], 1e-9));
    for (const s of got) expect(s[0]).toBe(1);
    // Only complex pairs become quadratic sections.
    for (const s of got) if (s.length === 3) expect(s[1] * s[1] - 4 * s[2]).toBeLessThan(0);
  });
});
