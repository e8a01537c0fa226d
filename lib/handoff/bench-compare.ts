/**
 * Bench data against the model: crossover and margins read from the measured points, and the
 * model-minus-measured difference at the measured frequencies.
 *
 * Margins use the engine's definitions and crossing finder (lib/engine/margins.ts): fc is the
 * highest downward 0 dB crossing, PM = 180° + ∠T(fc), GM at the first −180° crossing above
 * fc, crossings interpolated linearly in log-frequency between samples. The measured phase is
 * unwrapped first and put on the branch where its lowest-frequency point lies in
 * (−270°, 90°], the branch of T for a loop with an integrator, so the numbers compare with
 * the model's.
 */
import { computeMargins, interpolateLogF, unwrapPhase } from '@/lib/engine/margins';
import { wrapDeg } from '@/lib/engine/transfer';
import { shiftPhase180, type BenchPoints } from './bench-parse';

export interface MeasuredMargins {
  /** Highest downward 0 dB crossing of the measured gain, Hz; null when it never crosses. */
  crossoverHz: number | null;
  /** 180° + phase at crossover. */
  phaseMarginDeg: number | null;
  /** −gain at the first −180° crossing above fc, dB; null when there is none. */
  gainMarginDb: number | null;
  phaseCrossoverHz: number | null;
  /** How many 0 dB crossings the measured gain has (more than one deserves a look). */
  gainCrossings: number;
}

/** Unwrap degrees so that neighbours differ by at most 180°, then shift to the branch of T. */
export function unwrapToLoopBranch(phaseDeg: readonly number[]): number[] {
  const out = unwrapPhase(phaseDeg);
  if (out.length === 0) return out;
  const shift = -360 * Math.ceil((out[0] - 90) / 360);
  return out.map((p) => p + shift);
}

/** Crossover, phase margin and gain margin read from measured points. */
export function measureMargins(points: BenchPoints): MeasuredMargins {
  const m = computeMargins({ f: points.f, magDb: points.gainDb, phaseDeg: unwrapToLoopBranch(points.phaseDeg) });
  return {
    crossoverHz: m.crossoverHz,
    phaseMarginDeg: m.phaseMarginDeg,
    gainMarginDb: m.gainMarginDb,
    phaseCrossoverHz: m.phaseCrossoverHz,
    gainCrossings: m.crossings.filter((c) => c.kind === 'gain').length,
  };
}

export interface ModelTrace {
  f: readonly number[];
  magDb: readonly number[];
  phaseDeg: readonly number[];
}

/**
 * Model minus measured at each measured frequency inside the model's sweep: gain in dB,
 * phase in degrees wrapped to (−180°, 180°]. Points outside the sweep are left out.
 */
export function modelMinusMeasured(model: ModelTrace, measured: BenchPoints): BenchPoints {
  const out: BenchPoints = { f: [], gainDb: [], phaseDeg: [] };
  const lo = model.f[0];
  const hi = model.f[model.f.length - 1];
  for (let k = 0; k < measured.f.length; k++) {
    const x = measured.f[k];
    if (!(x >= lo && x <= hi)) continue;
    out.f.push(x);
    out.gainDb.push(interpolateLogF(model.f, model.magDb, x) - measured.gainDb[k]);
    out.phaseDeg.push(wrapDeg(interpolateLogF(model.f, model.phaseDeg, x) - measured.phaseDeg[k]));
  }
  return out;
}

/** Largest absolute value of a list, or null when empty. */
export const largestDeviation = (xs: readonly number[]): number | null =>
  xs.length === 0 ? null : xs.reduce((m, x) => Math.max(m, Math.abs(x)), 0);

export interface BenchComparison {
  /** Measured points as displayed: 180° taken off when shifted, phase on the branch of T. */
  points: BenchPoints;
  measured: MeasuredMargins;
  /** Model minus measured at the measured frequencies inside the model sweep. */
  difference: BenchPoints;
  largestGainDifferenceDb: number | null;
  largestPhaseDifferenceDeg: number | null;
}

/** Everything the Handoff screen shows of one bench data set against a model loop. */
export function compareBench(stored: BenchPoints, phaseShifted: boolean, model: ModelTrace): BenchComparison {
  const points = displayBenchPoints(stored, phaseShifted);
  const difference = modelMinusMeasured(model, points);
  return {
    points,
    measured: measureMargins(points),
    difference,
    largestGainDifferenceDb: largestDeviation(difference.gainDb),
    largestPhaseDifferenceDeg: largestDeviation(difference.phaseDeg),
  };
}

/** Stored points as displayed (shift applied, phase on the branch of T), without a model. */
export function displayBenchPoints(stored: BenchPoints, phaseShifted: boolean): BenchPoints {
  const phase = phaseShifted ? shiftPhase180(stored).phaseDeg : stored.phaseDeg;
  return { f: stored.f, gainDb: stored.gainDb, phaseDeg: unwrapToLoopBranch(phase) };
}
