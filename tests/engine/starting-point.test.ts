import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { compensatorTransfer, shapeFromParts } from '@/lib/engine/compensator';
import { analyze, preparePlant } from '@/lib/engine/analyze';
import { defaultCrossoverHz, kFactorParts, placeForType, proposeForPlant, reachOf } from '@/lib/engine/starting-point';
import { marginsForCompensator } from '@/lib/engine/analyze';
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

/**
 * Where the starting point begins and what it says when a target is out of reach. An invented
 * boost, 9 → 30 V at 350 kHz: RHP zero D'²R/(2πL) ≈ 41 kHz (Erickson & Maksimović, 2nd ed.,
 * §8.2.2, the boost's control-to-output zero), so fsw/10 = 35 kHz would sit above a third of it.
 */
describe('starting point: default target and reach', () => {
  const boost930: AnalyzeRequest = makeRequest({
    converter: { topology: 'boost', vin: 9, vout: 30, iout: 1, fsw: 350e3, l: 10e-6, rl: 0.02, c: 40e-6, rc: 0.005, vd: 0.4 },
    feedback: { vref: 1.2 },
  });

  it('defaults fc to the lower of fsw/10 and a third of the RHP zero (common practice)', () => {
    expect(defaultCrossoverHz(400e3, null)).toBe(40e3);
    expect(defaultCrossoverHz(350e3, 41e3)).toBeCloseTo(41e3 / 3, 9);
    expect(defaultCrossoverHz(100e3, 90e3)).toBe(10e3);
    const p = preparePlant(boost930);
    expect(p.plant.rhpZeroHz!).toBeGreaterThan(35e3);
    expect(defaultCrossoverHz(350e3, p.plant.rhpZeroHz)).toBeCloseTo(p.plant.rhpZeroHz! / 3, 9);
  });

  it('a target out of reach says what is reachable, never more boost than the type can give nor "use Type III" to Type III', () => {
    const p = preparePlant(boost930);
    let message = '';
    try {
      proposeForPlant(p, { crossoverHz: 60e3, phaseMarginDeg: 60, method: 'k-factor', type: 'type3', r1: 10e3 });
    } catch (err) {
      message = err instanceof EngineInputError ? err.issues[0].message : String(err);
    }
    expect(message).toMatch(/Reachable with Type III: PM 60\.0° with fc up to [\d.]+ kHz/);
    expect(message).toMatch(/PM up to [\d.]+° at 60 kHz/);
    expect(message).not.toMatch(/use Type III/);
    // The fc offered is real: the K factor there lands on the asked margin.
    const reach = reachOf(p, 'type3', 60e3, 60);
    expect(reach.reachable).toBe(false);
    expect(reach.maxCrossoverHz!).toBeLessThan(p.plant.rhpZeroHz!);
    const comp = proposeForPlant(p, { crossoverHz: reach.maxCrossoverHz!, phaseMarginDeg: 60, method: 'k-factor', type: 'type3', r1: 10e3 });
    const m = marginsForCompensator(p, comp);
    expectRel(m.crossoverHz, reach.maxCrossoverHz!, 1e-6, 'fc');
    expectAbs(m.phaseMarginDeg, 60, 1e-6, 'PM');
  });

  it('changing the type keeps fc and the PM target for every type, and explains each fallback', () => {
    const p = preparePlant(boost930);
    const fc = defaultCrossoverHz(350e3, p.plant.rhpZeroHz);
    const three = placeForType(p, { type: 'type3', crossoverHz: fc, phaseMarginDeg: 55, r1: 10e3 });
    expect(three.note).toBeNull();
    const m3 = marginsForCompensator(p, three.compensator);
    expectRel(m3.crossoverHz, fc, 1e-6, 'Type III fc');
    expectAbs(m3.phaseMarginDeg, 55, 1e-6, 'Type III PM');
    for (const type of ['type1', 'type2'] as const) {
      const placed = placeForType(p, { type, crossoverHz: fc, phaseMarginDeg: 55, r1: 10e3 });
      const m = marginsForCompensator(p, placed.compensator);
      expect(placed.compensator.type).toBe(type);
      if (placed.note === null) {
        expectRel(m.crossoverHz, fc, 1e-6, `${type} fc`);
        expectAbs(m.phaseMarginDeg, 55, 1e-6, `${type} PM`);
      } else {
        // The note names the type and what it gave; the margin is never left negative without saying so.
        expect(placed.note).toMatch(type === 'type1' ? /Type I adds no phase boost/ : /Type II/);
        expect(placed.note).toMatch(/Placed/);
        expect(m.phaseMarginDeg!).toBeGreaterThan(45);
      }
    }
  });

  it('Type I on a buck lowers fc below the LC resonance until the margin holds, and says so', () => {
    const p = preparePlant(makeRequest());
    const placed = placeForType(p, { type: 'type1', crossoverHz: 50e3, phaseMarginDeg: 60, r1: 10e3 });
    expect(placed.note).toMatch(/Type I adds no phase boost, so at 50 kHz the power stage \(−1\d\d\.\d°\) leaves a phase margin of −/);
    const m = marginsForCompensator(p, placed.compensator);
    expect(m.crossoverHz!).toBeLessThan(p.plant.resonanceHz!);
    expect(m.phaseMarginDeg!).toBeGreaterThan(55);
  });
});
