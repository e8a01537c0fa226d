/**
 * Inverting op-amp compensators, Type I/II/III, in both directions (parts ↔ poles/zeros).
 *
 * Parts: R1 from the output to the inverting input; R2 in series with C1 in the feedback
 * path; C2 across the feedback path (0 = absent); R3 in series with C3 across R1 (Type III).
 *
 *   Type I:   Zi = R1,                 Zf = 1/(sC1)
 *   Type II:  Zi = R1,                 Zf = (R2 + 1/(sC1)) ∥ 1/(sC2)
 *   Type III: Zi = R1 ∥ (R3 + 1/(sC3)), Zf as Type II
 *   Gc = Zf/Zi (the op-amp's inversion is the loop's own negative feedback, not counted again)
 *
 * which reduce to (Basso 2012, from memory; checked by algebra in the tests):
 *   Gc = (1 + sR2C1)(1 + s(R1+R3)C3) / [s·R1(C1+C2)·(1 + sR2·C1C2/(C1+C2))·(1 + sR3C3)]
 * Type II drops the C3 factors; Type I is 1/(sR1C1).
 */
import Complex from 'complex.js';
import type { SectionedTransfer } from './transfer';
import { dbFromMag } from './transfer';
import {
  EngineInputError,
  type CompensatorInput,
  type CompensatorShape,
  type CompensatorSummary,
} from './types';

const TWO_PI = 2 * Math.PI;

/** Parts of a compensator with defaults filled (unused parts 0). */
interface Parts {
  r1: number;
  r2: number;
  r3: number;
  c1: number;
  c2: number;
  c3: number;
}

const partsOf = (c: CompensatorInput): Parts => ({
  r1: c.r1,
  r2: c.r2 ?? 0,
  r3: c.r3 ?? 0,
  c1: c.c1,
  c2: c.c2 ?? 0,
  c3: c.c3 ?? 0,
});

/** Impedances Zi (input) and Zf (feedback) at complex s, Ω — the definitions verbatim. */
export const compensatorImpedances = (comp: CompensatorInput, s: Complex): { zi: Complex; zf: Complex } => {
  const p = partsOf(comp);
  const capZ = (cap: number) => new Complex(1, 0).div(s.mul(cap));
  const parallel = (a: Complex, b: Complex) => a.mul(b).div(a.add(b));
  if (comp.type === 'type1') return { zi: new Complex(p.r1, 0), zf: capZ(p.c1) };
  const series = capZ(p.c1).add(p.r2);
  const zf = p.c2 > 0 ? parallel(series, capZ(p.c2)) : series;
  const zi = comp.type === 'type3' ? parallel(new Complex(p.r1, 0), capZ(p.c3).add(p.r3)) : new Complex(p.r1, 0);
  return { zi, zf };
};

/**
 * Gc as sections: gain 1/(R1(C1+C2)), one integrator, numerator (1+sR2C1)(1+s(R1+R3)C3),
 * denominator (1 + sR2C1C2/(C1+C2))(1+sR3C3). Factors of one kind are merged into a single
 * quadratic section (both angles lie in 0…90°, so the merged angle stays continuous).
 */
export const compensatorTransfer = (comp: CompensatorInput): SectionedTransfer => {
  const p = partsOf(comp);
  if (comp.type === 'type1') return { gain: 1 / (p.r1 * p.c1), originOrder: -1, num: [], den: [] };
  const ct = p.c1 + p.c2;
  const tz1 = p.r2 * p.c1;
  const tp1 = (p.r2 * p.c1 * p.c2) / ct;
  const gain = 1 / (p.r1 * ct);
  if (comp.type === 'type2') {
    return { gain, originOrder: -1, num: [[1, tz1]], den: tp1 > 0 ? [[1, tp1]] : [] };
  }
  const tz2 = (p.r1 + p.r3) * p.c3;
  const tp2 = p.r3 * p.c3;
  return {
    gain,
    originOrder: -1,
    num: [[1, tz1 + tz2, tz1 * tz2]],
    den: tp1 > 0 ? [[1, tp1 + tp2, tp1 * tp2]] : [[1, tp2]],
  };
};

/** Integrator 0 dB frequency 1/(2π·R1·(C1+C2)), Hz. */
export const integratorHz = (comp: CompensatorInput): number => {
  const p = partsOf(comp);
  return 1 / (TWO_PI * p.r1 * (p.c1 + p.c2));
};

/**
 * Handle view of a compensator (R1 fixed): integrator 0 dB frequency, zeros and poles in Hz
 * (origin pole excluded), listed by part:
 * Type II zeros [1/(2πR2C1)], poles [(C1+C2)/(2πR2C1C2)] or [] when C2 = 0;
 * Type III zeros [1/(2πR2C1), 1/(2π(R1+R3)C3)], poles [(C1+C2)/(2πR2C1C2), 1/(2πR3C3)],
 * and with C2 = 0 poles [1/(2πR3C3)] only.
 */
export const shapeFromParts = (comp: CompensatorInput): CompensatorShape => {
  const p = partsOf(comp);
  const base = { type: comp.type, r1: p.r1, integratorHz: integratorHz(comp) };
  if (comp.type === 'type1') return { ...base, zerosHz: [], polesHz: [] };
  const fz1 = 1 / (TWO_PI * p.r2 * p.c1);
  const fp1 = p.c2 > 0 ? (p.c1 + p.c2) / (TWO_PI * p.r2 * p.c1 * p.c2) : null;
  if (comp.type === 'type2') return { ...base, zerosHz: [fz1], polesHz: fp1 === null ? [] : [fp1] };
  const fz2 = 1 / (TWO_PI * (p.r1 + p.r3) * p.c3);
  const fp2 = 1 / (TWO_PI * p.r3 * p.c3);
  return { ...base, zerosHz: [fz1, fz2], polesHz: fp1 === null ? [fp2] : [fp1, fp2] };
};

const positive = (v: number | undefined, path: string, what: string) => {
  if (v === undefined || !Number.isFinite(v) || v <= 0) {
    throw new EngineInputError([{ path, message: `${what} must be a positive frequency` }]);
  }
  return v;
};

/**
 * Parts from a shape, R1 held fixed (inverse of {@link shapeFromParts}):
 *   Ct = C1 + C2 = 1/(2π·R1·fi);  C2 = Ct·fz1/fp1;  C1 = Ct − C2;  R2 = 1/(2π·fz1·C1)
 *   R3 = R1/(fp2/fz2 − 1);  C3 = 1/(2π·fp2·R3)
 * @throws EngineInputError when a pole sits at or below the zero it is paired with
 *   (paths "shape.polesHz.0", "shape.polesHz.1"), or a frequency is not positive.
 */
export const partsFromShape = (shape: CompensatorShape): CompensatorInput => {
  const r1 = shape.r1;
  if (!(r1 > 0) || !Number.isFinite(r1)) throw new EngineInputError([{ path: 'shape.r1', message: 'R1 must be above 0 Ω' }]);
  const fi = positive(shape.integratorHz, 'shape.integratorHz', 'the integrator 0 dB frequency');
  const ct = 1 / (TWO_PI * r1 * fi);
  if (shape.type === 'type1') return { type: 'type1', r1, c1: ct };
  const fz1 = positive(shape.zerosHz[0], 'shape.zerosHz.0', 'the first zero');
  const hasP1 = shape.type === 'type2' ? shape.polesHz.length > 0 : shape.polesHz.length > 1;
  let c2 = 0;
  if (hasP1) {
    const fp1 = positive(shape.polesHz[0], 'shape.polesHz.0', 'the first pole');
    if (fp1 <= fz1) {
      throw new EngineInputError([
        { path: 'shape.polesHz.0', message: 'the R2·C1 pole must sit above its zero; move the pole up or the zero down' },
      ]);
    }
    c2 = (ct * fz1) / fp1;
  }
  const c1 = ct - c2;
  const r2 = 1 / (TWO_PI * fz1 * c1);
  if (shape.type === 'type2') return { type: 'type2', r1, r2, c1, c2 };
  const fz2 = positive(shape.zerosHz[1], 'shape.zerosHz.1', 'the second zero');
  const idx = hasP1 ? 1 : 0;
  const fp2 = positive(shape.polesHz[idx], `shape.polesHz.${idx}`, 'the R3·C3 pole');
  if (fp2 <= fz2) {
    throw new EngineInputError([
      { path: `shape.polesHz.${idx}`, message: 'the R3·C3 pole must sit above the (R1+R3)·C3 zero; move the pole up or the zero down' },
    ]);
  }
  const r3 = r1 / (fp2 / fz2 - 1);
  const c3 = 1 / (TWO_PI * fp2 * r3);
  return { type: 'type3', r1, r2, r3, c1, c2, c3 };
};

/**
 * Summary: poles (origin listed as 0) and zeros in Hz by part, integrator frequency and the
 * mid-band gain R2·C1/(R1(C1+C2)) (Type III: × (R1+R3)/R3), in dB; null for Type I.
 */
export const summarizeCompensator = (comp: CompensatorInput): CompensatorSummary => {
  const shape = shapeFromParts(comp);
  const p = partsOf(comp);
  let mid: number | null = null;
  if (comp.type !== 'type1') {
    mid = (p.r2 * p.c1) / (p.r1 * (p.c1 + p.c2));
    if (comp.type === 'type3') mid *= (p.r1 + p.r3) / p.r3;
  }
  return {
    type: comp.type,
    polesHz: [0, ...shape.polesHz],
    zerosHz: shape.zerosHz,
    midbandGainDb: mid === null ? null : dbFromMag(mid),
    integratorHz: shape.integratorHz,
  };
};

/**
 * Lower divider resistor for the DC set point, Rb = R1·Vref/(|Vout| − Vref), Ω.
 * For the inverting buck-boost this assumes the controller is referenced to the negative
 * output, so it senses |Vout| across R1 + Rb.
 */
export const dividerRb = (r1: number, vref: number, vout: number): number => (r1 * vref) / (Math.abs(vout) - vref);
