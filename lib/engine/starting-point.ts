/**
 * Starting point: a first compensator for a target crossover fc and phase margin, returned
 * as an ordinary CompensatorInput that the designer edits afterwards.
 *
 * K factor (Venable, "The K Factor: A New Mathematical Tool for Stability Analysis and
 * Synthesis", Proc. Powercon 10, 1983; equations from memory). With the plant
 * phase P at fc (negative) and Gc = Zf/Zi (op-amp inversion not counted):
 *   boost = PM − P − 90°,  G = 1/|plant(fc)|
 *   Type II:  K = tan(boost/2 + 45°);  C2 = 1/(2π·fc·G·K·R1);  C1 = C2(K² − 1);  R2 = K/(2π·fc·C1)
 *   Type III: K = tan²(boost/4 + 45°); C2 = 1/(2π·fc·G·R1);    C1 = C2(K − 1);  R2 = √K/(2π·fc·C1);
 *             R3 = R1/(K − 1);  C3 = 1/(2π·fc·√K·R3)
 *   Type I:   C1 = 1/(2π·fc·G·R1) (no boost: the margin is what the plant leaves).
 *
 * Pole-zero rules (common practice): zeros at the LC resonance (Type III:
 * 0.5·f0 and f0), poles at the ESR zero (when below fsw/2) and at fsw/2, then the
 * integrator frequency scaled so |T(fc)| = 1. The target PM is not used by these rules.
 */
import { compensatorTransfer, partsFromShape } from './compensator';
import { preparePlant, type PreparedPlant, type StageRequest } from './analyze';
import { transferEvaluator } from './sweep';
import type { SectionedTransfer } from './transfer';
import { EngineInputError, type CompensatorInput, type CompensatorShape, type CompensatorType } from './types';

const TWO_PI = 2 * Math.PI;
const DEG = Math.PI / 180;

export type StartingPointMethod = 'k-factor' | 'pole-zero';

export interface StartingPointTarget {
  crossoverHz: number;
  phaseMarginDeg: number;
  method: StartingPointMethod;
  type: CompensatorType;
  /** The fixed top resistor R1, Ω. */
  r1: number;
}

export interface KFactorInput {
  type: CompensatorType;
  crossoverHz: number;
  /** Compensator gain needed at fc, |Gc(fc)| (absolute, not dB). */
  gain: number;
  r1: number;
  /** Phase boost above the −90° of the integrator, degrees. */
  boostDeg: number;
}

/** Largest boost each type can give (exclusive), degrees. */
const MAX_BOOST: Record<CompensatorType, number> = { type1: 0, type2: 90, type3: 180 };

/**
 * Venable's K-factor placement (formulas in the module header).
 * @throws EngineInputError (path "target.phaseMarginDeg") when the boost is out of the
 *   type's reach (Type II below 90°, Type III below 180°), or not positive.
 */
export const kFactorParts = (x: KFactorInput): { k: number; compensator: CompensatorInput } => {
  const { type, crossoverHz: fc, gain: g, r1, boostDeg } = x;
  const wc = TWO_PI * fc;
  if (type === 'type1') return { k: 1, compensator: { type, r1, c1: 1 / (wc * g * r1) } };
  if (!(boostDeg > 0) || boostDeg >= MAX_BOOST[type]) {
    const name = type === 'type2' ? 'Type II' : 'Type III';
    throw new EngineInputError([
      {
        path: 'target.phaseMarginDeg',
        message:
          boostDeg > 0
            ? `${name} can add less than ${MAX_BOOST[type]}° of phase boost, and this target needs ${boostDeg.toFixed(1)}°; ${type === 'type2' ? 'use Type III, ' : ''}lower fc or ask for less phase margin`
            : `the plant already gives the requested margin at this fc (boost ${boostDeg.toFixed(1)}°); use Type I or ask for more phase margin`,
      },
    ]);
  }
  if (type === 'type2') {
    const k = Math.tan((boostDeg / 2 + 45) * DEG);
    const c2 = 1 / (wc * g * k * r1);
    const c1 = c2 * (k * k - 1);
    const r2 = k / (wc * c1);
    return { k, compensator: { type, r1, r2, c1, c2 } };
  }
  const t = Math.tan((boostDeg / 4 + 45) * DEG);
  const k = t * t;
  const sk = Math.sqrt(k);
  const c2 = 1 / (wc * g * r1);
  const c1 = c2 * (k - 1);
  const r2 = sk / (wc * c1);
  const r3 = r1 / (k - 1);
  const c3 = 1 / (wc * sk * r3);
  return { k, compensator: { type, r1, r2, r3, c1, c2, c3 } };
};

/** |H(j2πf)| as an absolute magnitude. */
const magAt = (h: SectionedTransfer, hz: number) => Math.pow(10, transferEvaluator(h, hz)(hz).magDb / 20);

/** Plant magnitude (absolute) and phase (deg, on the Bode branch) at one frequency. */
const plantAt = (prepared: PreparedPlant, hz: number) => {
  const p = transferEvaluator(prepared.plantTransfer, prepared.sweep.fStart)(hz);
  return { mag: Math.pow(10, p.magDb / 20), phaseDeg: p.phaseDeg };
};

/** Pole-zero placement by the rules in the module header. */
const poleZeroShape = (prepared: PreparedPlant, target: StartingPointTarget): CompensatorShape => {
  const f0 = prepared.plant.resonanceHz ?? target.crossoverHz / 5;
  const half = prepared.converter.fsw / 2;
  const esr = prepared.plant.esrZeroHz;
  const base = { type: target.type, r1: target.r1, integratorHz: 1 };
  if (target.type === 'type1') return { ...base, zerosHz: [], polesHz: [] };
  if (target.type === 'type2') {
    const fp = esr !== null && esr < half ? Math.max(esr, 2 * f0) : half;
    return { ...base, zerosHz: [f0], polesHz: [fp] };
  }
  const fp1 = esr !== null && esr < half ? Math.max(esr, 2 * f0) : half;
  return { ...base, zerosHz: [f0 / 2, f0], polesHz: [fp1, half] };
};

/**
 * Starting point for a prepared plant. The compensator gain is scaled so |T(fc)| = 1.
 * @throws EngineInputError when the target cannot be reached with the chosen type.
 */
export const proposeForPlant = (prepared: PreparedPlant, target: StartingPointTarget): CompensatorInput => {
  const fc = target.crossoverHz;
  if (!(fc > 0) || !Number.isFinite(fc)) {
    throw new EngineInputError([{ path: 'target.crossoverHz', message: 'the target crossover must be above 0 Hz' }]);
  }
  if (!(target.r1 > 0)) throw new EngineInputError([{ path: 'target.r1', message: 'R1 must be above 0 Ω' }]);
  const p = plantAt(prepared, fc);
  if (target.method === 'k-factor') {
    const boostDeg = target.phaseMarginDeg - p.phaseDeg - 90;
    return kFactorParts({ type: target.type, crossoverHz: fc, gain: 1 / p.mag, r1: target.r1, boostDeg }).compensator;
  }
  // Gc is proportional to the integrator frequency for fixed poles and zeros.
  const unit = poleZeroShape(prepared, target);
  const gcUnit = magAt(compensatorTransfer(partsFromShape(unit)), fc);
  return partsFromShape({ ...unit, integratorHz: 1 / (gcUnit * p.mag) });
};

/** Starting point for a design (the plant is analysed first). */
export const proposeCompensator = (design: StageRequest, target: StartingPointTarget): CompensatorInput =>
  proposeForPlant(preparePlant(design), target);
