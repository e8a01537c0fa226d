import { describe, expect, it } from 'vitest';
import { computeDuty, computeOperatingPoint } from '@/lib/engine/steady-state';
import { buildPlantModel } from '@/lib/engine/plant';
import { EngineInputError, type ConverterInput } from '@/lib/engine/types';
import { expectRel } from './helpers';

const conv = (over: Partial<ConverterInput>): ConverterInput => ({
  topology: 'buck', vin: 12, vout: 5, iout: 2, fsw: 200e3, l: 10e-6, rl: 0, c: 100e-6, rc: 0, vd: 0, ...over,
});

describe('duty cycle of the averaged DC model', () => {
  // Erickson & Maksimović 2nd ed., Table 7.1 (from memory): M(D) = D, 1/D', −D/D' for lossless stages.
  it.each([
    ['buck', 24, 5, 5 / 24],
    ['boost', 12, 24, 0.5],
    ['buck-boost', 12, 5, 5 / 17],
  ] as const)('lossless %s %s V → %s V gives the ideal conversion ratio', (topology, vin, vout, d) => {
    expectRel(computeDuty(conv({ topology, vin, vout })), d, 1e-12);
  });

  it('boost with inductor DCR follows M = (1/D′)·1/(1 + rl/(D′²R)) (Erickson & Maksimović §3.3, from memory)', () => {
    const c = conv({ topology: 'boost', vin: 5, vout: 12, iout: 1, rl: 0.1 });
    const dp = 1 - computeDuty(c);
    const r = c.vout / c.iout;
    expectRel((c.vin / dp) / (1 + c.rl / (dp * dp * r)), c.vout, 1e-12);
  });

  it('buck-boost with inductor DCR follows M = (D/D′)·1/(1 + rl/(D′²R)) (Erickson & Maksimović ch. 3 problems, from memory)', () => {
    const c = conv({ topology: 'buck-boost', vin: 9, vout: 15, iout: 0.8, rl: 0.2 });
    const d = computeDuty(c);
    const dp = 1 - d;
    expectRel(((c.vin * d) / dp) / (1 + c.rl / (dp * dp * c.vout / c.iout)), c.vout, 1e-12);
  });

  it('buck with diode drop: D = (V + vd)/(Vg + vd) (volt-second balance, from memory)', () => {
    expectRel(computeDuty(conv({ vin: 24, vout: 5, vd: 0.5 })), 5.5 / 24.5, 1e-12);
  });

  it('takes the lower (physical) root of the boost quadratic', () => {
    // Both roots satisfy the DC balance; the physical one has the smaller duty.
    const c = conv({ topology: 'boost', vin: 5, vout: 12, iout: 2, rl: 0.15, vd: 0.4 });
    const d = computeDuty(c);
    expect(d).toBeGreaterThan(1 - 5 / 12.4);
    expect(d).toBeLessThan(0.75);
  });

  it('the averaged state-space model reproduces vout at the computed duty, with every loss', () => {
    for (const topology of ['buck', 'boost', 'buck-boost'] as const) {
      const c = conv({ topology, vin: 10, vout: topology === 'buck' ? 3.3 : 15, iout: 1.5, rl: 0.05, rc: 0.04, vd: 0.35 });
      expectRel(buildPlantModel(c).vOutModel, c.vout, 1e-12, topology);
    }
  });

  it('rejects outputs the losses cannot reach', () => {
    expect(() => computeDuty(conv({ topology: 'boost', vin: 3, vout: 48, iout: 5, rl: 0.5 }))).toThrow(EngineInputError);
    try {
      computeDuty(conv({ vin: 5, vout: 4.9, iout: 10, rl: 0.1 }));
      expect.unreachable();
    } catch (e) {
      expect((e as EngineInputError).issues[0].path).toBe('converter.vout');
    }
  });
});

describe('ripple and the CCM/DCM boundary', () => {
  it('buck ripple: ΔiL = (Vg − V)·D·Ts/L, Δv = ΔiL/(8·C·fsw) (Erickson & Maksimović ch. 2, from memory)', () => {
    const c = conv({ vin: 12, vout: 5, iout: 2, l: 10e-6, c: 100e-6, fsw: 200e3, rc: 0.01 });
    const op = computeOperatingPoint(c);
    const d = 5 / 12;
    const di = ((12 - 5) * d) / (10e-6 * 200e3);
    expectRel(op.inductorRipplePp, di, 1e-12);
    expectRel(op.inductorPeak, 2 + di / 2, 1e-12);
    expectRel(op.outputRippleCapPp, di / (8 * 100e-6 * 200e3), 1e-12);
    expectRel(op.outputRippleEsrPp, di * 0.01, 1e-12);
  });

  // Erickson & Maksimović Table 5.1 (from memory): CCM iff K = 2L/(R·Ts) > Kcrit(D),
  // Kcrit = D′ (buck), D·D′² (boost), D′² (buck-boost). So Lcrit = Kcrit·R·Ts/2.
  it.each([
    ['buck', 12, 5, (d: number) => 1 - d],
    ['boost', 5, 12, (d: number) => d * (1 - d) ** 2],
    ['buck-boost', 12, 5, (d: number) => (1 - d) ** 2],
  ] as const)('%s critical inductance matches Kcrit·R·Ts/2', (topology, vin, vout, kcrit) => {
    const c = conv({ topology, vin, vout, iout: 0.5 });
    const op = computeOperatingPoint(c);
    const r = vout / 0.5;
    expectRel(op.criticalInductance, (kcrit(op.duty) * r) / (2 * c.fsw), 1e-12);
    expect(op.conduction).toBe(c.l > op.criticalInductance ? 'CCM' : 'DCM');
    // Critical load: at iout = criticalLoadCurrent the stage sits on the boundary.
    const edge = computeOperatingPoint({ ...c, iout: op.criticalLoadCurrent * 1.0001 });
    expect(edge.conduction).toBe('CCM');
    const below = computeOperatingPoint({ ...c, iout: op.criticalLoadCurrent * 0.999 });
    expect(below.conduction).toBe('DCM');
  });
});
