import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { compensatorTransfer } from '@/lib/engine/compensator';
import { atanStep, defaultSweep, lnStep, logSweep, loopPass, makeGrid, nearWatch, planTransfer, scanCandidates, sweepComplex, sweepGrid, sweepTransfer, transferEvaluator, type Grid } from '@/lib/engine/sweep';
import { evaluateTransfer, multiplyTransfers, transferFromPolys, wrapDeg, type SectionedTransfer } from '@/lib/engine/transfer';
import { expectAbs, expectRel } from './helpers';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { loopCompensatorTransfer, preparePlant } from '@/lib/engine/analyze';

const TWO_PI = 2 * Math.PI;

/** The sweep of h on the grid equals its analytic transfer, on the trace's branch, within tol dB and degrees. */
const expectTraceIsAnalytic = (h: SectionedTransfer, grid: Grid, tol: number) => {
  const s = sweepTransfer(h, grid);
  const exact = transferEvaluator(h, grid.f[0], s.phaseDeg[0]);
  grid.f.forEach((hz, i) => {
    expectAbs(s.magDb[i], exact(hz).magDb, tol);
    expectAbs(s.phaseDeg[i], exact(hz).phaseDeg, tol);
  });
};

describe('logSweep', () => {
  it('default: 10 Hz to fsw/2, 400 points', () => {
    expect(defaultSweep(300e3)).toEqual({ fStart: 10, fStop: 150e3, points: 400 });
  });

  it('is geometric with exact end points', () => {
    const f = logSweep(10, 150e3, 400);
    expect(f).toHaveLength(400);
    expect(f[0]).toBe(10);
    expect(f[399]).toBe(150e3);
    const r = (150e3 / 10) ** (1 / 399);
    f.forEach((x, i) => expectRel(x, 10 * r ** i, 1e-12));
  });
});

describe('transferEvaluator', () => {
  it('its magnitude-only and phase-only forms give the same numbers, to the bit', () => {
    const h = compensatorTransfer({ type: 'type3', r1: 1e4, r2: 2e4, r3: 500, c1: 2.2e-9, c2: 47e-12, c3: 1e-9 });
    const ev = transferEvaluator(h, 10);
    for (const hz of [10, 333, 4.1e3, 2.2e5]) {
      expect(ev.magDbAt!(hz)).toBe(ev(hz).magDb);
      expect(ev.phaseDegAt!(hz)).toBe(ev(hz).phaseDeg);
    }
  });
});

describe('sweepGrid', () => {
  it('shares the grid of the same options among the last few in use, and builds it as logSweep does', () => {
    const a = sweepGrid(10, 150e3, 400);
    expect(a.f).toEqual(logSweep(10, 150e3, 400));
    expect(a.w[7]).toBe(TWO_PI * a.f[7]);
    for (let k = 1; k <= 5; k++) sweepGrid(10, k * 1e5, 400);
    expect(sweepGrid(10, 150e3, 400)).toBe(a);
    expect(sweepGrid(10, 150e3, 401)).not.toBe(a);
  });
});

describe('sweepTransfer', () => {
  const cases = [
    ['Type III compensator (integrator)', compensatorTransfer({ type: 'type3', r1: 1e4, r2: 2e4, r3: 500, c1: 2.2e-9, c2: 47e-12, c3: 1e-9 })],
    ['RHP zero and LC pair', transferFromPolys([3, -2e-5, 1e-10], [1, 4e-5, 2.5e-9])],
    ['negative gain and a zero at the origin', multiplyTransfers(transferFromPolys([0, -2e-3], [1, 1e-4]), transferFromPolys([1], [1, 1e-6, 1e-10]))],
    // Four real poles, as a finite op-amp's stage has: merged two by two into quadratics for the sweep.
    ['four real poles and a quadratic zero', { gain: 3, originOrder: 0, num: [[1, 1e-4, 2e-9]], den: [[1, 2.5], [1, 7e-9], [1, 1e-6], [1, 3e-5]] }],
    // A boost's RHP zero (with the ESR zero) pairs with the load pole; the sampling pair stays apart.
    ['RHP zero with a real pole and a high-Q pair', { gain: 40, originOrder: 0, num: [[1, -2.3e-6, -5.6e-13]], den: [[1, 4.4e-4], [1, 3.5e-8, 6.3e-13]] }],
    ['two RHP real zeros and mixed poles', { gain: -0.5, originOrder: -1, num: [[1, -1e-5], [1, -3e-6]], den: [[1, 1e-3], [1, 2e-7], [1, -1e-7]] }],
  ] as const;

  it.each(cases)('%s: magnitude, phase and complex samples match the polynomial ratio', (_, h) => {
    const f = logSweep(1, 1e7, 300);
    const s = sweepTransfer(h, makeGrid(f));
    const c = sweepComplex(h, makeGrid(f));
    for (let i = 0; i < f.length; i++) {
      const ref = evaluateTransfer(h, new Complex(0, TWO_PI * f[i]));
      expectAbs(s.magDb[i], 20 * Math.log10(ref.abs()), 1e-9);
      expectAbs(wrapDeg(s.phaseDeg[i] - (ref.arg() * 180) / Math.PI), 0, 1e-9);
      expect(Math.hypot(c.re[i] - ref.re, c.im[i] - ref.im) / ref.abs()).toBeLessThan(1e-12);
    }
    // Continuous phase: no jump of 180° or more between neighbouring samples.
    for (let i = 1; i < f.length; i++) expect(Math.abs(s.phaseDeg[i] - s.phaseDeg[i - 1])).toBeLessThan(180);
    // Starts at the principal value.
    expect(s.phaseDeg[0]).toBeGreaterThan(-180);
    expect(s.phaseDeg[0]).toBeLessThanOrEqual(180);
  });

  // Several terms advance the phase by one arctangent per point (sweepByIncrements) when no grid
  // step can turn it by a radian; a sharp resonance on a coarse grid keeps the term-by-term sum.
  it.each([
    ...cases,
    ['Q = 50 pair and a zero on a coarse grid (term by term)', { gain: 2, originOrder: 0, num: [[1, 1e-5]], den: [[1, 1e-7 / 50, 1e-14], [1, 1e-3]] }],
  ] as [string, SectionedTransfer][])('%s: the trace is the analytic phase on its branch, not just modulo 360°', (_, h) => {
    for (const points of [300, 40]) expectTraceIsAnalytic(h, makeGrid(logSweep(1, 1e7, points)), 1e-9);
  });
});

// The sweeps' step series against the built-ins (Math.atan, Math.log: fdlibm's, correctly
// rounded to within an ulp), over the whole range where the series are used and past it.
describe('atanStep and lnStep', () => {
  it('atanStep is Math.atan to within 2 ulp for |x| < 1/16 and Math.atan itself beyond', () => {
    for (let k = -2000; k <= 2000; k++) {
      const x = (k / 2000) * (1 / 16) * 0.999999;
      const ref = Math.atan(x);
      expect(Math.abs(atanStep(x) - ref)).toBeLessThanOrEqual(2 * Number.EPSILON * Math.abs(ref) + Number.MIN_VALUE);
    }
    for (const x of [1 / 16, -0.07, 0.5, -3, 1e6]) expect(atanStep(x)).toBe(Math.atan(x));
  });

  it('lnStep adds ln(q/qp) for q/qp in 0.88…1.13, and takes Math.log(q) beyond', () => {
    for (const qp of [1e-12, 0.37, 1, 4.2e9]) {
      for (let k = -1000; k <= 1000; k++) {
        const r = Math.exp((k / 1000) * 0.1249);
        const q = qp * r;
        const step = lnStep(0, q, qp);
        const ref = Math.log(q / qp);
        // 4 ulp of the step, plus the rounding of q/qp (half an ulp of 1) in the reference itself.
        expect(Math.abs(step - ref)).toBeLessThanOrEqual(4 * Number.EPSILON * Math.abs(ref) + Number.EPSILON / 2);
      }
      expect(lnStep(123, 1.2 * qp, qp)).toBe(Math.log(1.2 * qp));
      expect(lnStep(123, 0.8 * qp, qp)).toBe(Math.log(0.8 * qp));
    }
    expect(lnStep(5, 0, 0)).toBe(-Infinity);
  });

  it('sample designs: every plant and compensator trace is its analytic transfer to 1e-12 dB and degrees', () => {
    for (const s of [...SAMPLE_DESIGNS, ...MODE_SAMPLES]) {
      const prepared = preparePlant(s.request);
      const gc = loopCompensatorTransfer(prepared, s.request.compensator);
      for (const h of [prepared.plantTransfer, gc]) {
        // The step path is the one taken (slope bound times the grid's step under a radian).
        expect(planTransfer(h).slope * prepared.grid.lnStep).toBeLessThan(1);
        expectTraceIsAnalytic(h, prepared.grid, 1e-12);
      }
    }
  });
});

describe('scanCandidates', () => {
  it('adds the intervals on both sides of each near sample to the crossings, ascending and once each', () => {
    const near = nearWatch(0.1, 1);
    near.gainAt.push(0, 3, 4, 9);
    near.phaseAt.push(6);
    const c = scanCandidates({ gainAt: [5, 7], phaseAt: [2] }, near, 10);
    // Sample 0 has no interval before it and sample 9 (the last) none after it.
    expect(c.gainAt).toEqual([0, 2, 3, 4, 5, 7, 8]);
    expect(c.phaseAt).toEqual([2, 5, 6]);
  });
});

describe('loopPass', () => {
  it('adds two traces, notes the sign changes, the first sample below −180° above 0 dB, and the samples near 0 dB and −180°', () => {
    const f = [1, 2, 3, 4, 5, 6];
    const base = { magDb: [10, 5, 1, 0, -3, -10], phaseDeg: [-100, -150, -178, -181, -185, -170] };
    const comp = { magDb: [0, 0, 0, 0.05, 0, 0], phaseDeg: [0, 0, 0, 0, 0, 0] };
    const near = nearWatch(0.5, 2.5);
    const pass = loopPass(base, comp, f, near);
    expect(pass.magDb).toEqual([10, 5, 1, 0.05, -3, -10]);
    expect(pass.crossings.gainAt).toEqual([3]);
    expect(pass.crossings.phaseAt).toEqual([2, 4]);
    expect(pass.belowMinus180Hz).toBe(4);
    expect(near.gainAt).toEqual([3]);
    expect(near.phaseAt).toEqual([2, 3]);
    expect(near.only).toEqual({ gainAt: [2, 3], phaseAt: [1, 2, 3, 4] });
  });

  it('leaves no intervals when the loop starts within the bound of ±180° (the nearby loop may start a turn away)', () => {
    const near = nearWatch(0.5, 5);
    loopPass({ magDb: [10, -10], phaseDeg: [-177, -200] }, { magDb: [0, 0], phaseDeg: [0, 0] }, [1, 2], near);
    expect(near.only).toBeUndefined();
  });
});
