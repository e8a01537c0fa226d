import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import {
  compensatorImpedances,
  compensatorTransfer,
  dividerRb,
  partsFromShape,
  shapeFromParts,
  summarizeCompensator,
} from '@/lib/engine/compensator';
import { evaluateTransfer } from '@/lib/engine/transfer';
import { EngineInputError, type CompensatorInput } from '@/lib/engine/types';
import { expectRel } from './helpers';

const TWO_PI = 2 * Math.PI;
const TYPE1: CompensatorInput = { type: 'type1', r1: 10e3, c1: 4.7e-9 };
const TYPE2: CompensatorInput = { type: 'type2', r1: 10e3, r2: 33e3, c1: 6.8e-9, c2: 150e-12 };
const TYPE2_NO_C2: CompensatorInput = { type: 'type2', r1: 10e3, r2: 33e3, c1: 6.8e-9, c2: 0 };
const TYPE3: CompensatorInput = { type: 'type3', r1: 20e3, r2: 15e3, r3: 470, c1: 4.7e-9, c2: 100e-12, c3: 2.2e-9 };
const TYPE3_NO_C2: CompensatorInput = { ...TYPE3, c2: 0 };
const ALL = [TYPE1, TYPE2, TYPE2_NO_C2, TYPE3, TYPE3_NO_C2];

describe('Gc = Zf/Zi', () => {
  it.each(ALL.map((c) => [`${c.type} c2=${c.c2 ?? '-'}`, c] as const))(
    '%s: the sectioned transfer equals the impedance ratio of the parts (issue 3 definitions)',
    (_, comp) => {
      const h = compensatorTransfer(comp);
      for (const f of [1, 100, 3e3, 47e3, 1e6]) {
        const s = new Complex(0, TWO_PI * f);
        const { zi, zf } = compensatorImpedances(comp, s);
        const ref = zf.div(zi);
        expect(evaluateTransfer(h, s).sub(ref).abs() / ref.abs(), `${f} Hz`).toBeLessThan(1e-12);
      }
    },
  );
});

describe('pole and zero formulas (CHECK-VALUES §2.2; Basso 2012, from memory)', () => {
  it('Type I: Gc = 1/(s·R1·C1), integrator at 1/(2π·R1·C1)', () => {
    const s = summarizeCompensator(TYPE1);
    expectRel(s.integratorHz, 1 / (TWO_PI * 10e3 * 4.7e-9), 1e-12);
    expect(s.polesHz).toEqual([0]);
    expect(s.zerosHz).toEqual([]);
    expect(s.midbandGainDb).toBeNull();
  });

  it('Type II: integrator 1/(2πR1(C1+C2)), fz = 1/(2πR2C1), fp = (C1+C2)/(2πR2C1C2)', () => {
    const { r1, r2, c1, c2 } = TYPE2 as Required<CompensatorInput>;
    const s = summarizeCompensator(TYPE2);
    expectRel(s.integratorHz, 1 / (TWO_PI * r1 * (c1 + c2)), 1e-12);
    expectRel(s.zerosHz[0], 1 / (TWO_PI * r2 * c1), 1e-12);
    expect(s.polesHz[0]).toBe(0);
    expectRel(s.polesHz[1], (c1 + c2) / (TWO_PI * r2 * c1 * c2), 1e-12);
    expectRel(s.midbandGainDb, 20 * Math.log10((r2 * c1) / (r1 * (c1 + c2))), 1e-12);
    // The flat region really has that gain: between fz and fp, far from both.
    const mid = Math.sqrt(s.zerosHz[0] * s.polesHz[1]);
    const g = evaluateTransfer(compensatorTransfer(TYPE2), new Complex(0, TWO_PI * mid)).abs();
    expectRel(g, (r2 * c1) / (r1 * (c1 + c2)), 0.05);
  });

  it('Type II with C2 = 0 has no high-frequency pole', () => {
    const s = summarizeCompensator(TYPE2_NO_C2);
    expect(s.polesHz).toEqual([0]);
    expect(shapeFromParts(TYPE2_NO_C2).polesHz).toEqual([]);
  });

  it('Type III: zeros 1/(2πR2C1), 1/(2π(R1+R3)C3); poles 0, (C1+C2)/(2πR2C1C2), 1/(2πR3C3)', () => {
    const { r1, r2, r3, c1, c2, c3 } = TYPE3 as Required<CompensatorInput>;
    const s = summarizeCompensator(TYPE3);
    expectRel(s.zerosHz[0], 1 / (TWO_PI * r2 * c1), 1e-12);
    expectRel(s.zerosHz[1], 1 / (TWO_PI * (r1 + r3) * c3), 1e-12);
    expect(s.polesHz[0]).toBe(0);
    expectRel(s.polesHz[1], (c1 + c2) / (TWO_PI * r2 * c1 * c2), 1e-12);
    expectRel(s.polesHz[2], 1 / (TWO_PI * r3 * c3), 1e-12);
    expectRel(s.midbandGainDb, 20 * Math.log10(((r2 * c1) / (r1 * (c1 + c2))) * ((r1 + r3) / r3)), 1e-12);
  });
});

describe('shape ↔ parts with R1 fixed', () => {
  it.each(ALL.map((c) => [`${c.type} c2=${c.c2 ?? '-'}`, c] as const))('%s round-trips', (_, comp) => {
    const back = partsFromShape(shapeFromParts(comp));
    for (const k of ['r1', 'r2', 'r3', 'c1', 'c2', 'c3'] as const) {
      const a = comp[k] ?? 0;
      const b = back[k] ?? 0;
      if (a === 0) expect(b, k).toBe(0);
      else expectRel(b, a, 1e-12, k);
    }
  });

  it('a moved handle changes only its own pole or zero', () => {
    const shape = shapeFromParts(TYPE3);
    const moved = partsFromShape({ ...shape, zerosHz: [shape.zerosHz[0] * 1.5, shape.zerosHz[1]] });
    const again = shapeFromParts(moved);
    expectRel(again.zerosHz[0], shape.zerosHz[0] * 1.5, 1e-12);
    expectRel(again.zerosHz[1], shape.zerosHz[1], 1e-12);
    again.polesHz.forEach((p, i) => expectRel(p, shape.polesHz[i], 1e-12));
    expectRel(again.integratorHz, shape.integratorHz, 1e-12);
    expect(moved.r1).toBe(TYPE3.r1);
  });

  it('refuses a pole at or below its zero, naming the handle', () => {
    const shape = shapeFromParts(TYPE2);
    expect(() => partsFromShape({ ...shape, polesHz: [shape.zerosHz[0] * 0.9] })).toThrow(EngineInputError);
    try {
      const s3 = shapeFromParts(TYPE3);
      partsFromShape({ ...s3, polesHz: [s3.polesHz[0], s3.zerosHz[1]] });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineInputError).issues[0].path).toBe('shape.polesHz.1');
    }
    expect(() => partsFromShape({ ...shape, integratorHz: -1 })).toThrow(EngineInputError);
  });
});

describe('divider', () => {
  it('Rb = R1·Vref/(|Vout| − Vref): 10 kΩ, 0.8 V, 3.3 V → 3.2 kΩ', () => {
    expectRel(dividerRb(10e3, 0.8, 3.3), 3200, 1e-12);
    expectRel(dividerRb(10e3, 1.25, -12), (10e3 * 1.25) / 10.75, 1e-12);
  });
});
