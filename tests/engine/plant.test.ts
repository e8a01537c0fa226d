import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { buildPlantModel, modulatedPlant, summarizePlant } from '@/lib/engine/plant';
import { evaluateTransfer } from '@/lib/engine/transfer';
import type { ConverterInput } from '@/lib/engine/types';
import { expectRel } from './helpers';

const TWO_PI = 2 * Math.PI;
const conv = (over: Partial<ConverterInput>): ConverterInput => ({
  topology: 'buck', vin: 12, vout: 5, iout: 2, fsw: 200e3, l: 10e-6, rl: 0, c: 100e-6, rc: 0, vd: 0, ...over,
});

/**
 * Lossless small-signal models, Erickson & Maksimović 2nd ed. §8.2.2 Table 8.2 (from memory;
 * CHECK-VALUES §2.1): Gvd = Gd0(1 − s/ωz)/(1 + s/(Qω0) + s²/ω0²), Gvg = M(1)/(same), and
 * the canonical model's output impedance sLe ∥ R ∥ 1/(sC) with Le = L (buck) or L/D′².
 * V is the output magnitude: the buck-boost Gd0 = V/(D·D′) is the sign-corrected value.
 */
const table82 = (c: ConverterInput) => {
  const r = c.vout / c.iout;
  const sq = Math.sqrt(c.l * c.c);
  if (c.topology === 'buck') {
    const d = c.vout / c.vin;
    return { d, gd0: c.vout / d, gg0: d, w0: 1 / sq, q: r * Math.sqrt(c.c / c.l), wz: null, le: c.l };
  }
  if (c.topology === 'boost') {
    const dp = c.vin / c.vout;
    return { d: 1 - dp, gd0: c.vout / dp, gg0: 1 / dp, w0: dp / sq, q: dp * r * Math.sqrt(c.c / c.l), wz: (dp * dp * r) / c.l, le: c.l / dp ** 2 };
  }
  const d = c.vout / (c.vin + c.vout);
  const dp = 1 - d;
  return { d, gd0: c.vout / (d * dp), gg0: d / dp, w0: dp / sq, q: dp * r * Math.sqrt(c.c / c.l), wz: (dp * dp * r) / (d * c.l), le: c.l / dp ** 2 };
};

const CASES: ConverterInput[] = [
  conv({ topology: 'buck', vin: 28, vout: 15, iout: 5, l: 50e-6, c: 500e-6 }),
  conv({ topology: 'buck', vin: 48, vout: 3.3, iout: 10, l: 1.5e-6, c: 400e-6 }),
  conv({ topology: 'boost', vin: 12, vout: 24, iout: 1, l: 10e-6, c: 100e-6 }),
  conv({ topology: 'boost', vin: 3.3, vout: 5, iout: 0.4, l: 2.2e-6, c: 22e-6 }),
  conv({ topology: 'buck-boost', vin: 12, vout: 12, iout: 1, l: 22e-6, c: 220e-6 }),
  conv({ topology: 'buck-boost', vin: 24, vout: 5, iout: 2, l: 33e-6, c: 100e-6 }),
];

describe('lossless limits vs Erickson & Maksimović Table 8.2 (from memory)', () => {
  it.each(CASES.map((c) => [`${c.topology} ${c.vin}→${c.vout} V`, c] as const))('%s', (_, c) => {
    const ref = table82(c);
    const model = buildPlantModel(c);
    expectRel(model.operatingPoint.duty, ref.d, 1e-12, 'D');
    const s = summarizePlant(model, c, 1);
    expectRel(10 ** (s.plant.dcGainDb! / 20), ref.gd0, 1e-9, 'Gd0');
    expectRel(s.plant.resonanceHz, ref.w0 / TWO_PI, 1e-9, 'f0');
    expectRel(s.plant.q, ref.q, 1e-9, 'Q');
    expect(s.plant.esrZeroHz).toBeNull();
    if (ref.wz === null) expect(s.plant.rhpZeroHz).toBeNull();
    else expectRel(s.plant.rhpZeroHz, ref.wz / TWO_PI, 1e-9, 'RHP zero');
    expectRel(10 ** (s.lineToOutput.dcGainDb! / 20), ref.gg0, 1e-9, 'Gg0');
    // Whole functions at several frequencies, not only the landmarks.
    for (const f of [10, 300, ref.w0 / TWO_PI, 5e3, 60e3]) {
      const sj = new Complex(0, TWO_PI * f);
      const den = sj.mul(1 / (ref.q * ref.w0)).add(sj.mul(sj).mul(1 / ref.w0 ** 2)).add(1);
      const gvd = (ref.wz === null ? new Complex(1, 0) : new Complex(1, 0).sub(sj.mul(1 / ref.wz))).mul(ref.gd0).div(den);
      const got = evaluateTransfer(model.gvd, sj);
      expect(got.sub(gvd).abs() / gvd.abs(), `Gvd at ${f} Hz`).toBeLessThan(1e-9);
      const gvg = new Complex(ref.gg0, 0).div(den);
      expect(evaluateTransfer(model.gvg, sj).sub(gvg).abs() / gvg.abs(), `Gvg at ${f} Hz`).toBeLessThan(1e-9);
      const r = c.vout / c.iout;
      const zout = new Complex(1, 0).div(new Complex(1, 0).div(sj.mul(ref.le)).add(1 / r).add(sj.mul(c.c)));
      expect(evaluateTransfer(model.zout, sj).sub(zout).abs() / zout.abs(), `Zout at ${f} Hz`).toBeLessThan(1e-9);
    }
  });

  it('boost 12 → 24 V, 1 A, 10 µH has its RHP zero at 95.49 kHz (CHECK-VALUES §2.1, computed from Table 8.2)', () => {
    const c = conv({ topology: 'boost', vin: 12, vout: 24, iout: 1, l: 10e-6, c: 100e-6 });
    expect(summarizePlant(buildPlantModel(c), c, 1).plant.rhpZeroHz! / 1e3).toBeCloseTo(95.49, 2);
  });
});

describe('lossy models', () => {
  it('buck ESR zero is exactly 1/(2π·rc·C) (Erickson & Maksimović ch. 8, from memory)', () => {
    const c = conv({ rc: 0.02, rl: 0.03, c: 220e-6 });
    const s = summarizePlant(buildPlantModel(c), c, 1);
    expectRel(s.plant.esrZeroHz, 1 / (TWO_PI * 0.02 * 220e-6), 1e-12);
    expect(s.plant.rhpZeroHz).toBeNull();
  });

  it('boost and buck-boost keep one RHP and one LHP (ESR) zero, both exact roots of the lossy numerator', () => {
    for (const topology of ['boost', 'buck-boost'] as const) {
      const c = conv({ topology, vin: 5, vout: 12, iout: 1, rl: 0.05, rc: 0.03, vd: 0.3, c: 220e-6 });
      const model = buildPlantModel(c);
      const s = summarizePlant(model, c, 1);
      for (const fz of [s.plant.rhpZeroHz!, -s.plant.esrZeroHz!]) {
        const v = evaluateTransfer(model.gvd, new Complex(TWO_PI * fz, 0));
        expect(v.abs()).toBeLessThan(1e-9 * 10 ** (s.plant.dcGainDb! / 20));
      }
      // Losses damp the resonance and pull the zeros only slightly from their ideal places.
      const ideal = table82({ ...c, vout: c.vout });
      expect(s.plant.q!).toBeLessThan(ideal.q);
      expectRel(s.plant.esrZeroHz, 1 / (TWO_PI * 0.03 * 220e-6), 0.05);
    }
  });

  it('the modulator divides the plant by Vramp; the sign-corrected buck-boost plant has a positive DC gain', () => {
    const c = conv({ topology: 'buck-boost', vin: 9, vout: 5, iout: 0.5, rl: 0.1 });
    const model = buildPlantModel(c);
    const p = modulatedPlant(model, 2.5);
    expect(p.gain).toBeGreaterThan(0);
    expectRel(p.gain, model.gvd.gain / 2.5, 1e-15);
    // DC control-to-|output| gain equals dV/dD of the DC model (finite difference on vin→vout).
    expect(evaluateTransfer(p, new Complex(0, 1e-3)).re).toBeGreaterThan(0);
  });

  it('Zout with rl = 0 has a zero at the origin: its DC gain is reported as null', () => {
    const c = conv({});
    const s = summarizePlant(buildPlantModel(c), c, 1);
    expect(s.outputImpedance.dcGainDb).toBeNull();
    expect(s.outputImpedance.zerosHz[0]).toBe(0);
  });

  it('the small-signal DC gain equals the slope of the DC model, dV/dD (finite difference)', () => {
    for (const topology of ['buck', 'boost', 'buck-boost'] as const) {
      const c = conv({ topology, vin: 10, vout: topology === 'buck' ? 4 : 16, iout: 1, rl: 0.08, rc: 0.02, vd: 0.4 });
      const model = buildPlantModel(c);
      // Perturb vout slightly, read the duty change: Gd0 ≈ ΔV/ΔD at constant load resistance.
      const r = c.vout / c.iout;
      const dv = 1e-4;
      const m2 = buildPlantModel({ ...c, vout: c.vout + dv, iout: (c.vout + dv) / r });
      const slope = dv / (m2.operatingPoint.duty - model.operatingPoint.duty);
      expectRel(model.gvd.gain, slope, 1e-5, topology);
    }
  });
});
