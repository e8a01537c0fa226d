import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { evalPoly, evalPolyJw, polyFromRealRoots, polyMul, polyRoots, polyTrim } from '@/lib/engine/complex-poly';
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

  it('finds roots at the origin and of cubics (Durand–Kerner)', () => {
    const p = polyMul([0, 1], polyFromRealRoots([-3, 5, -7e3]));
    const r = sortRoots(polyRoots(p));
    expect(r.map((x) => Math.round(x.re * 1e6) / 1e6)).toEqual([-7000, -3, 0, 5]);
    r.forEach((x) => expect(Math.abs(x.im)).toBeLessThan(1e-9));
  });
});
