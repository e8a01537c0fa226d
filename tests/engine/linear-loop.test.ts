import { describe, expect, it } from 'vitest';
import { expm, identity } from '@/lib/engine/matrix-exp';
import { simulateLoopStep, stepMetrics, type LoopBlocks } from '@/lib/engine/linear-loop';
import type { SectionedTransfer } from '@/lib/engine/transfer';
import { expectAbs, expectRel } from './helpers';

const ZERO: SectionedTransfer = { gain: 0, originOrder: 0, num: [], den: [] };
const UNITY: SectionedTransfer = { gain: 1, originOrder: 0, num: [], den: [] };

describe('matrix exponential', () => {
  it('e^{At} of a rotation generator is the rotation (closed form)', () => {
    const w = 3e5;
    const a = new Float64Array([0, w, -w, 0]);
    const e = expm(a, 2, 1e-5);
    expectAbs(e[0], Math.cos(3), 1e-13);
    expectAbs(e[1], Math.sin(3), 1e-13);
    expectAbs(e[2], -Math.sin(3), 1e-13);
  });
  it('e^{0} is the identity', () => {
    expect(Array.from(expm(new Float64Array(9), 3))).toEqual(Array.from(identity(3)));
  });
});

/**
 * Second-order step response, any control text, e.g. Ogata, Modern Control Engineering,
 * 5th ed., ch. 5 (from memory): for ωn²/(s² + 2ζωn·s + ωn²),
 * Mp = exp(−πζ/√(1−ζ²)), tp = π/(ωn√(1−ζ²)), y(t) = 1 − e^{−ζωn t}(cos ωd t + ζ/√(1−ζ²)·sin ωd t).
 */
describe('second-order closed loop against its closed form (Ogata ch. 5)', () => {
  // Unity feedback around P = ωn²/(s(s + 2ζωn)) gives exactly ωn²/(s² + 2ζωn s + ωn²).
  const secondOrder = (zeta: number, wn: number): LoopBlocks => ({
    control: { gain: wn / (2 * zeta), originOrder: -1, num: [], den: [[1, 1 / (2 * zeta * wn)]] },
    line: ZERO,
    zout: ZERO,
    compensator: UNITY,
  });
  for (const zeta of [0.2, 0.45, 0.7]) {
    it(`ζ = ${zeta}: overshoot, peak time and the whole curve`, () => {
      const wn = 2 * Math.PI * 1e3;
      const r = simulateLoopStep(secondOrder(zeta, wn), { input: 'reference', amplitude: 1, slewPerS: null, durationS: 20 / wn / zeta, points: 4001 });
      const m = stepMetrics(r.t, r.v, r.vFinal, 0.02);
      const wd = wn * Math.sqrt(1 - zeta * zeta);
      expectAbs(r.vFinal, 1, 1e-12, 'final value');
      expectRel(m.overshootFraction, Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 2e-4, 'Mp');
      expectAbs(m.peakTimeS, Math.PI / wd, (r.t[1] - r.t[0]) * 0.51, 'tp');
      let worst = 0;
      r.t.forEach((t, i) => {
        const y = 1 - Math.exp(-zeta * wn * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
        worst = Math.max(worst, Math.abs(r.v[i] - y));
      });
      expect(worst).toBeLessThan(1e-9);
      // 2 % settling ≈ 4/(ζωn) (Ogata ch. 5, an envelope estimate: within a factor of 1.5)
      expect(m.settlingTime!).toBeGreaterThan((4 / (zeta * wn)) / 1.5);
      expect(m.settlingTime!).toBeLessThan((4 / (zeta * wn)) * 1.5);
    });
  }

  it('a slewed reference: ramp then hold, exact against the integral of the step response', () => {
    const zeta = 0.5;
    const wn = 2 * Math.PI * 500;
    const tr = 0.4e-3;
    const r = simulateLoopStep(secondOrder(zeta, wn), { input: 'reference', amplitude: 2, slewPerS: 2 / tr, durationS: 5e-3, points: 777 });
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    const phi = Math.acos(zeta);
    // Ramp response of the second-order system (unit slope): t − 2ζ/ωn + e^{−ζωn t}·sin(ωd t + 2φ)/ωd.
    const rampResp = (t: number) => (t <= 0 ? 0 : t - (2 * zeta) / wn + (Math.exp(-zeta * wn * t) * Math.sin(wd * t + 2 * phi)) / wd);
    let worst = 0;
    r.t.forEach((t, i) => {
      const y = (2 / tr) * (rampResp(t) - rampResp(t - tr));
      worst = Math.max(worst, Math.abs(r.v[i] - y));
    });
    expect(worst).toBeLessThan(1e-9);
  });
});

/**
 * A closed loop of known ζ built from a first-order plant and an integrating compensator:
 * T = (ωi/s)·K/(1 + s/ωp) closes to ωn² = K·ωi·ωp, 2ζωn = ωp (algebra, as in Ogata ch. 5).
 * The load input goes through Zout/(1+T); with Zout = R the output is −R·ΔI·s(s+ωp)/(s²+2ζωn s+ωn²)/… checked by its peak.
 */
describe('a closed loop of known ζ (plant and compensator as separate blocks)', () => {
  it('reference step overshoot matches exp(−πζ/√(1−ζ²)) for ζ = 0.3', () => {
    const zeta = 0.3;
    const wp = 2 * Math.PI * 2e3;
    const wn = wp / (2 * zeta);
    const k = 4;
    const wi = (wn * wn) / (k * wp);
    const blocks: LoopBlocks = {
      control: { gain: k, originOrder: 0, num: [], den: [[1, 1 / wp]] },
      line: ZERO,
      zout: ZERO,
      compensator: { gain: wi, originOrder: -1, num: [], den: [] },
    };
    const r = simulateLoopStep(blocks, { input: 'reference', amplitude: 0.1, slewPerS: null, durationS: 30 / (zeta * wn), points: 6001 });
    const m = stepMetrics(r.t, r.v, r.vFinal, 0.001);
    expectRel(m.overshootFraction, Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 2e-4, 'Mp');
  });
});
