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
import { marginsForCompensator, preparePlant, type PreparedPlant, type StageRequest } from './analyze';
import { formatSi } from '@/lib/units/si';
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
 * Boost kept in hand when saying what is reachable, degrees: near the limit K grows without
 * bound (Type II at 80°: K = 11; Type III at 170°: K = 524), so the limit itself is not offered.
 */
const REACH_SPARE_DEG = 10;

const TYPE_NAMES: Record<CompensatorType, string> = { type1: 'Type I', type2: 'Type II', type3: 'Type III' };

/** Boost a type can be asked for when saying what is reachable, degrees (Type I: none). */
const usableBoost = (type: CompensatorType) => (type === 'type1' ? 0 : MAX_BOOST[type] - REACH_SPARE_DEG);

/**
 * Default target crossover, Hz: the lower of fsw/10 and a third of the RHP zero (common
 * practice: the averaged model and the sampling delay hold well below fsw/2, and the RHP
 * zero's phase lag is small below a third of its frequency).
 */
export const defaultCrossoverHz = (fsw: number, rhpZeroHz: number | null): number =>
  rhpZeroHz !== null && rhpZeroHz > 0 ? Math.min(fsw / 10, rhpZeroHz / 3) : fsw / 10;

/** What a compensator type can reach on a plant, for a target fc and phase margin. */
export interface Reach {
  /** Whether the target itself is reachable (boost above 0 and within the type's usable boost; Type I: the plant's own margin suffices). */
  reachable: boolean;
  /** Boost the target needs above the integrator's −90°, degrees. */
  boostDeg: number;
  /** Power-stage phase at the target fc, degrees. */
  plantPhaseDeg: number;
  /** The highest phase margin the type gives at the target fc (with the spare kept), degrees; may be ≤ 0. */
  maxPhaseMarginDeg: number;
  /** The highest fc, at or below the target and above the sweep start, where the target phase margin is reachable; null when there is none. */
  maxCrossoverHz: number | null;
}

/**
 * Reach of a type on a prepared plant: with the plant phase P(f), the K factor needs
 * boost = PM − P − 90°; Type II gives below 90°, Type III below 180° (less REACH_SPARE_DEG
 * here), Type I none, so its margin is 90° + P. The highest reachable fc is found on a log
 * grid from the sweep start up to the target, then refined by bisection.
 */
export const reachOf = (prepared: PreparedPlant, type: CompensatorType, crossoverHz: number, phaseMarginDeg: number): Reach => {
  const phaseAt = transferEvaluator(prepared.plantTransfer, prepared.sweep.fStart);
  const limit = usableBoost(type);
  const boostAt = (hz: number) => phaseMarginDeg - phaseAt(hz).phaseDeg - 90;
  const ok = (hz: number) => boostAt(hz) <= limit && (type === 'type1' || boostAt(hz) > 0);
  const plantPhaseDeg = phaseAt(crossoverHz).phaseDeg;
  const boostDeg = phaseMarginDeg - plantPhaseDeg - 90;
  let maxCrossoverHz: number | null = null;
  if (ok(crossoverHz)) maxCrossoverHz = crossoverHz;
  else {
    const lo = Math.min(prepared.sweep.fStart, crossoverHz);
    const n = 400;
    const step = Math.log(crossoverHz / lo) / n;
    for (let i = n - 1; i >= 0; i--) {
      const f = lo * Math.exp(step * i);
      if (!ok(f)) continue;
      // Bisect between the reachable f and the unreachable one above it.
      let a = f;
      let b = lo * Math.exp(step * (i + 1));
      for (let k = 0; k < 50; k++) {
        const m = Math.sqrt(a * b);
        if (ok(m)) a = m;
        else b = m;
      }
      maxCrossoverHz = a;
      break;
    }
  }
  return {
    reachable: ok(crossoverHz),
    boostDeg,
    plantPhaseDeg,
    maxPhaseMarginDeg: plantPhaseDeg + 90 + limit,
    maxCrossoverHz,
  };
};

const deg = (v: number) => `${v.toFixed(1).replace(/^-/, '−')}°`;

/** What to tell the designer when a target is out of a type's reach: what it can reach instead. */
export const describeReach = (type: CompensatorType, crossoverHz: number, phaseMarginDeg: number, reach: Reach): string => {
  const name = TYPE_NAMES[type];
  const at = formatSi(crossoverHz, 'Hz');
  const need =
    type === 'type1'
      ? `${name} adds no phase boost, so at ${at} the power stage (${deg(reach.plantPhaseDeg)}) leaves a phase margin of ${deg(reach.maxPhaseMarginDeg)}, not ${deg(phaseMarginDeg)}`
      : reach.boostDeg <= 0
        ? `at ${at} the power stage alone already leaves more than ${deg(phaseMarginDeg)} of margin, so ${name} has no boost to add`
        : `PM ${deg(phaseMarginDeg)} at ${at} needs ${deg(reach.boostDeg)} of phase boost; ${name} gives less than ${MAX_BOOST[type]}° (about ${usableBoost(type)}° in practice)`;
  const options: string[] = [];
  if (reach.maxCrossoverHz !== null) options.push(`PM ${deg(phaseMarginDeg)} with fc up to ${formatSi(reach.maxCrossoverHz, 'Hz')}`);
  if (type !== 'type1' && reach.boostDeg > 0 && reach.maxPhaseMarginDeg > 0) options.push(`PM up to ${deg(reach.maxPhaseMarginDeg)} at ${at}`);
  return options.length
    ? `${need}. Reachable with ${name}: ${options.join(', or ')}.`
    : `${need}, and no fc below ${at} reaches ${deg(phaseMarginDeg)} with ${name}.`;
};

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
    try {
      return kFactorParts({ type: target.type, crossoverHz: fc, gain: 1 / p.mag, r1: target.r1, boostDeg }).compensator;
    } catch (err) {
      if (!(err instanceof EngineInputError)) throw err;
      const reach = reachOf(prepared, target.type, fc, target.phaseMarginDeg);
      throw new EngineInputError([{ path: 'target.phaseMarginDeg', message: describeReach(target.type, fc, target.phaseMarginDeg, reach) }]);
    }
  }
  // Gc is proportional to the integrator frequency for fixed poles and zeros.
  const unit = poleZeroShape(prepared, target);
  const gcUnit = magAt(compensatorTransfer(partsFromShape(unit)), fc);
  return partsFromShape({ ...unit, integratorHz: 1 / (gcUnit * p.mag) });
};

/** A compensator of the asked type with a note when the target could not be kept as asked. */
export interface Placement {
  compensator: CompensatorInput;
  /** Why and how the placement differs from the target; null when the target was met. */
  note: string | null;
}

/**
 * Place a compensator of `type` for a target fc and PM (changing the compensator type keeps
 * both): the K factor at the target; when the type cannot reach it, the K factor at the
 * highest fc where it can (Type I: where the plant's own phase leaves the margin); when no fc
 * can, the pole-zero rules at the target fc. The note says which, with the margins it gives.
 */
export const placeForType = (prepared: PreparedPlant, target: Omit<StartingPointTarget, 'method'>): Placement => {
  const { type, crossoverHz: fc, phaseMarginDeg: pm } = target;
  const reach = reachOf(prepared, type, fc, pm);
  const result = (comp: CompensatorInput) => {
    const m = marginsForCompensator(prepared, comp);
    return m.crossoverHz === null ? 'no crossover' : `fc ${formatSi(m.crossoverHz, 'Hz')}, PM ${m.phaseMarginDeg === null ? '—' : deg(m.phaseMarginDeg)}`;
  };
  const kFactor = (hz: number) => proposeForPlant(prepared, { ...target, crossoverHz: hz, method: 'k-factor' });
  if (reach.reachable) {
    try {
      return { compensator: kFactor(fc), note: null };
    } catch {
      // Out of reach after all (e.g. a boost at or below 0°): handled below.
    }
  }
  const why = describeReach(type, fc, pm, reach);
  // Nearly there (within 5°): keep fc and take the margin the type gives there.
  if (type !== 'type1' && reach.boostDeg > 0 && reach.maxPhaseMarginDeg >= pm - 5) {
    try {
      const comp = proposeForPlant(prepared, { ...target, phaseMarginDeg: reach.maxPhaseMarginDeg, method: 'k-factor' });
      return { compensator: comp, note: `${why} Placed at ${formatSi(fc, 'Hz')} with the most the type gives: ${result(comp)}.` };
    } catch {
      // fall through
    }
  }
  if (reach.maxCrossoverHz !== null && reach.maxCrossoverHz < fc) {
    // The K factor reads the plant at fc only: a resonance peak can lift the loop back over
    // 0 dB (Type I below the LC resonance), so fc is lowered further until the loop crosses
    // where it was placed with about the margin asked.
    for (let hz = reach.maxCrossoverHz, i = 0; i < 16 && hz >= prepared.sweep.fStart; hz *= 0.7, i++) {
      try {
        const comp = kFactor(hz);
        const m = marginsForCompensator(prepared, comp);
        const held = m.crossoverHz !== null && Math.abs(m.crossoverHz / hz - 1) < 0.25 && m.phaseMarginDeg !== null && m.phaseMarginDeg >= pm - 5;
        if (held) return { compensator: comp, note: `${why} Placed with fc lowered to ${formatSi(hz, 'Hz')}: ${result(comp)}.` };
      } catch {
        break;
      }
    }
  }
  const comp = proposeForPlant(prepared, { ...target, method: 'pole-zero' });
  return { compensator: comp, note: `${why} Placed by the pole-zero rules at ${formatSi(fc, 'Hz')} instead: ${result(comp)}; check the margins.` };
};

/** Starting point for a design (the plant is analysed first). */
export const proposeCompensator = (design: StageRequest, target: StartingPointTarget): CompensatorInput =>
  proposeForPlant(preparePlant(design), target);
