import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { compensatorTransfer, shapeFromParts } from '@/lib/engine/compensator';
import { analyze, preparePlant } from '@/lib/engine/analyze';
import { kFactorParts, proposeForPlant } from '@/lib/engine/starting-point';
import { evaluateTransfer } from '@/lib/engine/transfer';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';
import { expectAbs, expectPrinted, expectRel, makeRequest } from './helpers';

const TWO_PI = 2 * Math.PI;
const gcAt = (c: Parameters<typeof compensatorTransfer>[0], f: number) => evaluateTransfer(compensatorTransfer(c), new Complex(0, TWO_PI * f));
const angleDeg = (z: Complex) => (Math.atan2(z.im, z.re) * 180) / Math.PI;

/**
 * K factor, Venable 1983 (equations from memory); vectors from CHECK-VALUES §2.3, computed
 * from those equations: fc 10 kHz, G 10, R1 10 kΩ. Printed values are compared to their last
 * printed digit; the invariants |Gc(fc)| = G and the phase at fc to 1e-6 relative.
 * Phase convention: the listed angles are of −Zf/Zi; the engine's Gc = Zf/Zi is 180° less.
 */
describe('K factor (Venable 1983, CHECK-VALUES §2.3)', () => {
  it('Type II, boost 60°', () => {
    const { k, compensator: c } = kFactorParts({ type: 'type2', crossoverHz: 10e3, gain: 10, r1: 10e3, boostDeg: 60 });
    expectPrinted(k, '3.73205');
    expectPrinted(c.c2!, '42.645', 1e-12, 'C2');
    expectPrinted(c.c1, '551.33', 1e-12, 'C1');
    expectPrinted(c.r2!, '107.735', 1e3, 'R2');
    const g = gcAt(c, 10e3);
    expectRel(g.abs(), 10, 1e-6, '|Gc(fc)|');
    expectRel(angleDeg(g.neg()), 150, 1e-6, '∠(−Zf/Zi)');
    expectRel(angleDeg(g), -30, 1e-6, '∠Gc');
    // Zero and pole sit at fc/K and K·fc.
    const sh = shapeFromParts(c);
    expectRel(sh.zerosHz[0], 10e3 / k, 1e-9);
    expectRel(sh.polesHz[0], 10e3 * k, 1e-9);
  });

  it('Type III, boost 120°', () => {
    const { k, compensator: c } = kFactorParts({ type: 'type3', crossoverHz: 10e3, gain: 10, r1: 10e3, boostDeg: 120 });
    expectPrinted(k, '13.9282');
    expectPrinted(c.c2!, '159.155', 1e-12, 'C2');
    expectPrinted(c.c1, '2.05759', 1e-9, 'C1');
    expectPrinted(c.r2!, '28.8675', 1e3, 'R2');
    expectPrinted(c.r3!, '773.50', 1, 'R3');
    expectPrinted(c.c3!, '5.51329', 1e-9, 'C3');
    const sh = shapeFromParts(c);
    sh.zerosHz.forEach((z) => expectPrinted(z, '2679.49', 1, 'double zero'));
    sh.polesHz.forEach((p) => expectPrinted(p, '37320.5', 1, 'double pole'));
    const g = gcAt(c, 10e3);
    expectRel(g.abs(), 10, 1e-6, '|Gc(fc)|');
    expectRel(angleDeg(g.neg()), -150, 1e-6, '∠(−Zf/Zi)');
    expectRel(angleDeg(g), 30, 1e-6, '∠Gc');
  });

  it('refuses a boost beyond the type (Type II below 90°, Type III below 180°)', () => {
    expect(() => kFactorParts({ type: 'type2', crossoverHz: 1e4, gain: 1, r1: 1e4, boostDeg: 95 })).toThrow(EngineInputError);
    expect(() => kFactorParts({ type: 'type3', crossoverHz: 1e4, gain: 1, r1: 1e4, boostDeg: 185 })).toThrow(EngineInputError);
    expect(() => kFactorParts({ type: 'type3', crossoverHz: 1e4, gain: 1, r1: 1e4, boostDeg: -5 })).toThrow(EngineInputError);
  });
});

describe('starting point on a real plant', () => {
  const ceramicBuck: AnalyzeRequest = makeRequest({
    converter: { topology: 'buck', vin: 12, vout: 1.8, iout: 5, fsw: 500e3, l: 1.5e-6, rl: 0.005, c: 200e-6, rc: 0.002 },
    feedback: { vref: 0.6 },
  });
  const electrolyticBoost: AnalyzeRequest = makeRequest({
    converter: { topology: 'boost', vin: 9, vout: 24, iout: 0.4, fsw: 300e3, l: 15e-6, rl: 0.04, c: 470e-6, rc: 0.1, vd: 0.4 },
    feedback: { vref: 1.25 },
  });

  it('K factor lands exactly on the target fc and PM (Type III, ceramic buck)', () => {
    const p = preparePlant(ceramicBuck);
    const comp = proposeForPlant(p, { crossoverHz: 50e3, phaseMarginDeg: 55, method: 'k-factor', type: 'type3', r1: 20e3 });
    const r = analyze({ ...ceramicBuck, compensator: comp });
    expectRel(r.margins.crossoverHz, 50e3, 1e-9, 'fc');
    expectAbs(r.margins.phaseMarginDeg, 55, 1e-6, 'PM');
  });

  it('K factor lands on target with Type II when the ESR zero is low (electrolytic boost)', () => {
    const p = preparePlant(electrolyticBoost);
    const comp = proposeForPlant(p, { crossoverHz: 4e3, phaseMarginDeg: 50, method: 'k-factor', type: 'type2', r1: 10e3 });
    const r = analyze({ ...electrolyticBoost, compensator: comp });
    expectRel(r.margins.crossoverHz, 4e3, 1e-9, 'fc');
    expectAbs(r.margins.phaseMarginDeg, 50, 1e-6, 'PM');
  });

  it('pole-zero rules: zeros at the LC resonance, poles at the ESR zero / fsw/2, |T(fc)| = 1 (common practice)', () => {
    const p = preparePlant(ceramicBuck);
    const comp = proposeForPlant(p, { crossoverHz: 50e3, phaseMarginDeg: 55, method: 'pole-zero', type: 'type3', r1: 20e3 });
    const sh = shapeFromParts(comp);
    expectRel(sh.zerosHz[0], p.plant.resonanceHz! / 2, 1e-9);
    expectRel(sh.zerosHz[1], p.plant.resonanceHz!, 1e-9);
    // ESR zero (≈ 400 kHz) is above fsw/2 = 250 kHz here, so both poles go to fsw/2.
    sh.polesHz.forEach((f) => expectRel(f, 250e3, 1e-9));
    const r = analyze({ ...ceramicBuck, compensator: comp });
    expectRel(r.margins.crossoverHz, 50e3, 1e-9, 'fc');
    expect(r.margins.phaseMarginDeg!).toBeGreaterThan(30);
  });
});
