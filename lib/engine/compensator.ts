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
 *
 * A finite op-amp A(s) = a0/(1 + s·a0/(2π·GBW)) turns the inverting stage into
 *   Gc = (Zf/Zi) / (1 + (1 + Zf/Zi)/A) = A·Zf / ((1 + A)·Zi + Zf)
 * (Sedra & Smith, Microelectronic Circuits, ch. 2: the inverting amplifier with finite gain).
 *
 * A transconductance amplifier drives its output network Zo = ro ∥ (R2 + 1/(sC1)) ∥ 1/(sC2)
 * from the divider's tap: Gc = gm·H(s)·Zo(s), H = Rb/(Rb + R1 ∥ (R3 + 1/(sC3))), i.e.
 *   H = H0·(1 + s(R1+R3)C3) / (1 + s(R3 + R1∥Rb)C3),  H0 = Rb/(R1 + Rb);
 * with ro infinite, Zo = (1 + sR2C1) / (s(C1+C2)(1 + sR2C1C2/(C1+C2))), the op-amp Type II
 * shape with 1/R1 replaced by gm·H0. Here the divider is inside the loop (no virtual ground).
 */
import Complex from 'complex.js';
import { evalPolyJw, polyMul } from './complex-poly';
import { multiplyTransfers, polyAdd, transferFromAnyPolys, transferFromPolys, type SectionedTransfer } from './transfer';
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
const idealOpAmpTransfer = (comp: CompensatorInput): SectionedTransfer => {
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

/** Zi = Ni/Di and Zf = Nf/Df of the op-amp stage as ascending polynomials. */
const opAmpPolys = (comp: CompensatorInput) => {
  const p = partsOf(comp);
  const zi = comp.type === 'type3' ? { n: [p.r1, p.r1 * p.r3 * p.c3], d: [1, (p.r1 + p.r3) * p.c3] } : { n: [p.r1], d: [1] };
  const zf = comp.type === 'type1' ? { n: [1], d: [0, p.c1] } : { n: [1, p.r2 * p.c1], d: [0, p.c1 + p.c2, p.r2 * p.c1 * p.c2] };
  return { zi, zf };
};

/**
 * The op-amp stage with a finite single-pole op-amp. The divider's Rb (comp.rb, when given)
 * sits at the inverting input, which is no longer a virtual ground, and adds to the noise
 * gain: Gc = A·Zf / ((1 + A)·Zi + Zf + Zi·Zf/Rb); Rb → ∞ is the textbook stage. As
 * polynomials: a0·Nf·Di / ((1 + a0 + sτ)·Ni·Df + (1 + sτ)·(Nf·Di + Ni·Nf/Rb)), τ = a0/(2π·GBW).
 */
const realOpAmpTransfer = (comp: CompensatorInput, a0: number, gbw: number, rb: number | undefined): SectionedTransfer => {
  const { zi, zf } = opAmpPolys(comp);
  const tau = a0 / (TWO_PI * gbw);
  const nfdi = polyMul(zf.n, zi.d);
  const num = nfdi.map((c) => c * a0);
  const loadRb = rb !== undefined && rb > 0 ? polyMul(zi.n, zf.n).map((c) => c / rb) : [0];
  const den = polyAdd(polyMul(polyMul(zi.n, zf.d), [1 + a0, tau]), polyMul(polyAdd(nfdi, loadRb), [1, tau]));
  return transferFromAnyPolys(num, den);
};

/** H0 = Rb/(R1 + Rb) and R1∥Rb of a transconductance stage. */
const dividerOf = (comp: CompensatorInput) => {
  const rb = comp.rb ?? 0;
  return { h0: rb / (comp.r1 + rb), rp: (comp.r1 * rb) / (comp.r1 + rb) };
};

/** gm·H(s)·Zo(s) (module header). */
const transconductanceTransfer = (comp: CompensatorInput): SectionedTransfer => {
  const p = partsOf(comp);
  const { h0, rp } = dividerOf(comp);
  const g = comp.ro !== undefined && comp.ro > 0 ? 1 / comp.ro : 0;
  // Zo = (1 + sR2C1) / (g(1 + sR2C1) + s(C1 + C2) + s²R2C1C2)
  const zo = transferFromPolys([1, p.r2 * p.c1], [g, g * p.r2 * p.c1 + p.c1 + p.c2, p.r2 * p.c1 * p.c2]);
  const gain: SectionedTransfer = { gain: (comp.gm ?? 0) * h0, originOrder: 0, num: [], den: [] };
  if (comp.type !== 'type3') return multiplyTransfers(gain, zo);
  const h = transferFromPolys([1, (p.r1 + p.r3) * p.c3], [1, (p.r3 + rp) * p.c3]);
  return multiplyTransfers(gain, h, zo);
};

/**
 * Gc of any compensator: ideal or finite op-amp stage, or transconductance amplifier. `rb`
 * (default comp.rb) is the divider's lower resistor loading a finite op-amp's inverting input;
 * the loop passes the one set by vref (analyze.ts, loopRb) rather than copying the parts.
 */
export const compensatorTransfer = (comp: CompensatorInput, rb: number | undefined = comp.rb): SectionedTransfer => {
  if (comp.amplifier === 'transconductance') return transconductanceTransfer(comp);
  if (comp.opamp) return realOpAmpTransfer(comp, comp.opamp.a0, comp.opamp.gbw, rb);
  return idealOpAmpTransfer(comp);
};

/**
 * Integrator 0 dB frequency, Hz: op-amp 1/(2π·R1·(C1+C2)); transconductance
 * gm·H0/(2π·(C1+C2)) (the asymptote with ro infinite).
 */
export const integratorHz = (comp: CompensatorInput): number => {
  const p = partsOf(comp);
  if (comp.amplifier === 'transconductance') return ((comp.gm ?? 0) * dividerOf(comp).h0) / (TWO_PI * (p.c1 + p.c2));
  return 1 / (TWO_PI * p.r1 * (p.c1 + p.c2));
};

/** What the handles carry through unchanged. */
const fixedOf = (comp: CompensatorInput): CompensatorShape['fixed'] => {
  if (comp.amplifier === 'transconductance') {
    return { amplifier: 'transconductance', gm: comp.gm, rb: comp.rb, ...(comp.ro !== undefined ? { ro: comp.ro } : {}) };
  }
  return comp.opamp ? { amplifier: comp.amplifier ?? 'opamp', opamp: comp.opamp } : comp.amplifier ? { amplifier: comp.amplifier } : undefined;
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
  // Built field by field (no spreads): this runs on every analysis and every drag frame.
  const shape: CompensatorShape = { type: comp.type, r1: p.r1, integratorHz: integratorHz(comp), zerosHz: [], polesHz: [] };
  const fixed = fixedOf(comp);
  if (fixed) shape.fixed = fixed;
  if (comp.type === 'type1') return shape;
  const fz1 = 1 / (TWO_PI * p.r2 * p.c1);
  const fp1 = p.c2 > 0 ? (p.c1 + p.c2) / (TWO_PI * p.r2 * p.c1 * p.c2) : null;
  if (comp.type === 'type2') {
    shape.zerosHz = [fz1];
    shape.polesHz = fp1 === null ? [] : [fp1];
    return shape;
  }
  const fz2 = 1 / (TWO_PI * (p.r1 + p.r3) * p.c3);
  const r3Pole = comp.amplifier === 'transconductance' ? p.r3 + dividerOf(comp).rp : p.r3;
  const fp2 = 1 / (TWO_PI * r3Pole * p.c3);
  shape.zerosHz = [fz1, fz2];
  shape.polesHz = fp1 === null ? [fp2] : [fp1, fp2];
  return shape;
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
  const fixed = shape.fixed ?? {};
  const gmStage = fixed.amplifier === 'transconductance';
  const divider = gmStage ? dividerOf({ type: shape.type, r1, c1: 1, rb: fixed.rb }) : null;
  // Op-amp: Ct = 1/(2π·R1·fi); transconductance: Ct = gm·H0/(2π·fi).
  const ct = divider ? ((fixed.gm ?? 0) * divider.h0) / (TWO_PI * fi) : 1 / (TWO_PI * r1 * fi);
  if (shape.type === 'type1') return { type: 'type1', r1, c1: ct, ...fixed };
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
  if (shape.type === 'type2') return { type: 'type2', r1, r2, c1, c2, ...fixed };
  const fz2 = positive(shape.zerosHz[1], 'shape.zerosHz.1', 'the second zero');
  const idx = hasP1 ? 1 : 0;
  const fp2 = positive(shape.polesHz[idx], `shape.polesHz.${idx}`, 'the R3·C3 pole');
  if (fp2 <= fz2) {
    throw new EngineInputError([
      { path: `shape.polesHz.${idx}`, message: 'the R3·C3 pole must sit above the (R1+R3)·C3 zero; move the pole up or the zero down' },
    ]);
  }
  if (divider) {
    // fz2 = 1/(2π(R1+R3)C3), fp2 = 1/(2π(R3 + R1∥Rb)C3): k = fp2/fz2 < R1/(R1∥Rb) = (R1+Rb)/Rb.
    const k = fp2 / fz2;
    const kMax = r1 / divider.rp;
    if (k >= kMax) {
      throw new EngineInputError([
        {
          path: `shape.polesHz.${idx}`,
          message: `with a transconductance amplifier the R3·C3 pole can sit at most ${kMax.toFixed(2)}× above its zero (the divider ratio (R1+Rb)/Rb); move them closer`,
        },
      ]);
    }
    const r3 = (r1 - k * divider.rp) / (k - 1);
    const c3 = 1 / (TWO_PI * fz2 * (r1 + r3));
    return { type: 'type3', r1, r2, r3, c1, c2, c3, ...fixed };
  }
  const r3 = r1 / (fp2 / fz2 - 1);
  const c3 = 1 / (TWO_PI * fp2 * r3);
  return { type: 'type3', r1, r2, r3, c1, c2, c3, ...fixed };
};

/**
 * Summary: poles (origin listed as 0) and zeros in Hz by part, integrator frequency and the
 * mid-band gain R2·C1/(R1(C1+C2)) (Type III: × (R1+R3)/R3), in dB; null for Type I.
 */
export const summarizeCompensator = (comp: CompensatorInput): CompensatorSummary => {
  const shape = shapeFromParts(comp);
  const p = partsOf(comp);
  let mid: number | null = null;
  const gmStage = comp.amplifier === 'transconductance';
  if (comp.type !== 'type1') {
    if (gmStage) {
      const { h0, rp } = dividerOf(comp);
      mid = ((comp.gm ?? 0) * h0 * p.r2 * p.c1) / (p.c1 + p.c2);
      if (comp.type === 'type3') mid *= (p.r1 + p.r3) / (p.r3 + rp);
    } else {
      mid = (p.r2 * p.c1) / (p.r1 * (p.c1 + p.c2));
      if (comp.type === 'type3') mid *= (p.r1 + p.r3) / p.r3;
    }
  }
  // A finite ro moves the integrator's origin pole to 1/(2π·ro·(C1+C2)).
  const lowPole = gmStage && comp.ro !== undefined && comp.ro > 0 ? 1 / (TWO_PI * comp.ro * (p.c1 + p.c2)) : 0;
  return {
    type: comp.type,
    amplifier: comp.amplifier ?? 'opamp',
    polesHz: [lowPole, ...shape.polesHz],
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

/**
 * The finite op-amp's noise gain NG = 1 + Zf/(Zi ∥ Rb) at each frequency, as [re, im]: the
 * realised stage is the ideal one times 1/(1 + NG/A) (Sedra & Smith, ch. 2; with the divider's
 * Rb at the inverting input, Gc = A·Zf/((1 + A)·Zi + Zf + Zi·Zf/Rb) divides to the same form).
 */
const noiseGains = (comp: CompensatorInput, freqsHz: readonly number[], rbIn: number | undefined): [number, number][] => {
  // Plain numbers from the stage's polynomials (Zf/Zi = Nf·Di/(Df·Ni)): complex.js values
  // here cost several microseconds per analysis of a finite op-amp.
  const { zi, zf } = opAmpPolys(comp);
  const rb = rbIn !== undefined && rbIn > 0 ? rbIn : Infinity;
  const out: [number, number][] = [];
  for (let k = 0; k < freqsHz.length; k++) {
    const w = TWO_PI * freqsHz[k];
    const [nfr, nfi] = evalPolyJw(zf.n, w);
    const [dir, dii] = evalPolyJw(zi.d, w);
    const [dfr, dfi] = evalPolyJw(zf.d, w);
    const [nir, nii] = evalPolyJw(zi.n, w);
    // Zf·(1/Zi + 1/Rb) = (Nf·Di + Nf·Ni/Rb) / (Df·Ni)
    const ar = nfr * dir - nfi * dii + (nfr * nir - nfi * nii) / rb;
    const ai = nfr * dii + nfi * dir + (nfr * nii + nfi * nir) / rb;
    const br = dfr * nir - dfi * nii;
    const bi = dfr * nii + dfi * nir;
    const bb = br * br + bi * bi;
    out.push([1 + (ar * br + ai * bi) / bb, (ai * br - ar * bi) / bb]);
  }
  return out;
};

/**
 * The departure 1/(1 + NG/A) of the realised stage from the ideal one at each frequency, with
 * A(jω) = a0/(1 + jω·a0/(2π·GBW)): the largest |Δ magnitude| in dB and |Δ phase| in degrees.
 */
const shapeErrorOf = (ng: readonly [number, number][], freqsHz: readonly number[], a0: number, gbw: number) => {
  let worstDb = 0;
  let worstDeg = 0;
  let atHz: number | null = null;
  const tau = a0 / (TWO_PI * gbw);
  for (let i = 0; i < freqsHz.length; i++) {
    const wt = TWO_PI * freqsHz[i] * tau;
    const [gr, gi] = ng[i];
    // 1 + NG·(1 + jωτ)/a0
    const er = 1 + (gr - gi * wt) / a0;
    const ei = (gi + gr * wt) / a0;
    const dDb = Math.abs(dbFromMag(Math.hypot(er, ei)));
    const dDeg = Math.abs((Math.atan2(ei, er) * 180) / Math.PI);
    if (dDb > worstDb || dDeg > worstDeg) atHz = freqsHz[i];
    worstDb = Math.max(worstDb, dDb);
    worstDeg = Math.max(worstDeg, dDeg);
  }
  return { worstDb, worstDeg, atHz };
};

/**
 * Largest departure of a finite op-amp stage from its ideal shape over the given frequencies:
 * |Δ magnitude| in dB and |Δ phase| in degrees, and where each occurs. Evaluated as the factor
 * 1/(1 + NG/A) by which the realised stage differs from the ideal one (see noiseGains): a few
 * complex products per frequency, no transfer to build.
 */
export const opAmpShapeError = (
  comp: CompensatorInput,
  freqsHz: readonly number[],
  rb: number | undefined = comp.rb,
): { worstDb: number; worstDeg: number; atHz: number | null } => {
  if (!comp.opamp || comp.amplifier === 'transconductance' || freqsHz.length === 0) return { worstDb: 0, worstDeg: 0, atHz: null };
  return shapeErrorOf(noiseGains(comp, freqsHz, rb), freqsHz, comp.opamp.a0, comp.opamp.gbw);
};

/**
 * A GBW that keeps the stage within 1 dB and 5° of its ideal shape at the given frequencies.
 * First estimate: the realised gain is the ideal one divided by 1 + NG/A with the noise gain
 * NG = 1 + Zf/(Zi ∥ Rb) (Sedra & Smith, ch. 2); with A ≈ GBW/(j·f) well above the op-amp's
 * pole, |NG/A| ≤ 0.08 (≈ 5°) needs GBW ≥ f·|NG(f)|/0.08. The estimate is then checked and
 * doubled until it holds (at most 6 times); null when a0 itself is the limit.
 */
export const gbwEnough = (comp: CompensatorInput, freqsHz: readonly number[], rb: number | undefined = comp.rb): number | null => {
  if (!comp.opamp) return null;
  const ng = noiseGains(comp, freqsHz, rb);
  let gbw = comp.opamp.gbw;
  for (let i = 0; i < freqsHz.length; i++) gbw = Math.max(gbw, (freqsHz[i] * Math.hypot(ng[i][0], ng[i][1])) / 0.08);
  for (let k = 0; k < 6; k++, gbw *= 2) {
    const e = shapeErrorOf(ng, freqsHz, comp.opamp.a0, gbw);
    if (e.worstDb <= 1 && e.worstDeg <= 5) return gbw;
  }
  return null;
};
