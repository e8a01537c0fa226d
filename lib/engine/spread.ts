/**
 * Tolerance spread: a Monte Carlo over the part tolerances of a design at its nominal line
 * and load. The compensator parts are drawn around the values that will be built, the
 * standard values of the request's series (analyze()'s `parts.snapped`), not the ideal ones
 * the handles placed: a tolerance is the spread of a real part around its marked value.
 * Each sample draws L, C, the ESR and every compensator part, builds the loop and
 * keeps its margins only (complex samples on the sweep grid, crossings refined on the
 * analytic loop, as analyze() does for snapped parts) — no Bode traces per sample.
 *
 * Distributions (the choice is reported with the result):
 * - uniform: value = nominal·(1 + tol·u), u uniform on [−1, 1]; ESR uniform on [min, max];
 * - normal: the tolerance is read as ±3σ (common practice), the deviate truncated at ±3σ
 *   (parts outside their tolerance are rejected by the maker's test); ESR centred on its
 *   interval with σ = (max − min)/6.
 * Every sample draws all nine values in a fixed order, so a seed gives the same samples
 * whatever parts the compensator type uses.
 */
import { loopMargins, loopPlant, loopPlantTransfer, standardValueCompensator } from './analyze';
import { dividerRb } from './compensator';
import { createRandom, type Random } from './random';
import { DEFAULT_TARGETS, partsTolerances, rangeIssues, type MarginTargets, type OperatingRange } from './range';
import { withLossDefaults } from './steady-state';
import { validateRequest } from './validate';
import { EngineInputError, type AnalyzeRequest, type CompensatorInput } from './types';

export type SpreadDistribution = 'uniform' | 'normal';

export interface SpreadOptions {
  samples: number;
  seed: number;
  distribution?: SpreadDistribution;
  targets?: MarginTargets;
  /** Histogram bins per quantity (default 24). */
  bins?: number;
}

/** The largest spread one request may ask for (bounded work per request). */
export const MAX_SPREAD_SAMPLES = 100_000;

export interface Percentiles {
  p1: number;
  p50: number;
  p99: number;
}

export interface Histogram {
  /** bins + 1 edges, ascending; counts[i] holds values in [edges[i], edges[i+1]) (the last bin closed). */
  edges: number[];
  counts: number[];
}

type Quantity = 'crossoverHz' | 'phaseMarginDeg' | 'gainMarginDb';

export interface SpreadResult {
  samples: number;
  seed: number;
  distribution: SpreadDistribution;
  /** The line and load the spread holds fixed (the nominal design's). */
  conditions: { vin: number; iout: number };
  tolerances: { l: number; c: number; rc: { min: number; max: number }; resistorTol: number; capacitorTol: number };
  nominal: { crossoverHz: number | null; phaseMarginDeg: number | null; gainMarginDb: number | null };
  /** Over the samples that have the quantity; null when none has it. */
  percentiles: Record<Quantity, Percentiles | null>;
  histograms: Record<Quantity, Histogram | null>;
  /** Samples without the quantity: no crossover (fc, PM) or no −180° crossing (GM). */
  missing: Record<Quantity, number>;
  targets: MarginTargets;
  /** Samples with a crossover, PM ≥ target and GM ≥ target (no −180° crossing counts as met). */
  meetsTargets: { count: number; share: number };
}

/** A deviate in [−1, 1] scaled to the tolerance: uniform, or normal with ±1 = ±3σ, truncated. */
const drawUnit = (rnd: Random, normal: boolean): number => {
  if (!normal) return 2 * rnd.next() - 1;
  for (;;) {
    const z = rnd.normal();
    if (z >= -3 && z <= 3) return z / 3;
  }
};

/** Linear interpolation between order statistics (the common "type 7" definition, as numpy's default). */
export const percentileOfSorted = (sorted: ArrayLike<number>, p: number): number => {
  const h = (sorted.length - 1) * (p / 100);
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
};

const histogramOf = (sorted: Float64Array, bins: number): Histogram => {
  const lo = sorted[0];
  const hi = sorted[sorted.length - 1];
  const width = hi > lo ? (hi - lo) / bins : 1;
  const n = hi > lo ? bins : 1;
  const edges = Array.from({ length: n + 1 }, (_, i) => (i === n ? (hi > lo ? hi : lo + width) : lo + i * width));
  const counts = new Array<number>(n).fill(0);
  for (let i = 0; i < sorted.length; i++) counts[Math.min(n - 1, Math.floor((sorted[i] - lo) / width))]++;
  return { edges, counts };
};

/**
 * Run the spread. `onProgress(done, total)` is called every few hundred samples (the Web
 * Worker posts it to the page). @throws EngineInputError for an impossible design or range.
 */
export const runSpread = (
  request: AnalyzeRequest,
  range: OperatingRange,
  options: SpreadOptions,
  onProgress?: (done: number, total: number) => void,
): SpreadResult => {
  validateRequest(request);
  const issues = rangeIssues(range);
  if (!(Number.isInteger(options.samples) && options.samples >= 1 && options.samples <= MAX_SPREAD_SAMPLES))
    issues.push({ path: 'samples', message: `samples must be a whole number from 1 to ${MAX_SPREAD_SAMPLES.toLocaleString('en-US')}` });
  if (issues.length > 0) throw new EngineInputError(issues);
  const distribution = options.distribution ?? 'uniform';
  const normal = distribution === 'normal';
  const targets = options.targets ?? DEFAULT_TARGETS;
  const n = options.samples;
  const cv = withLossDefaults(request.converter);
  const tol = partsTolerances(range, request.parts);
  // The parts as built (standard values); a finite op-amp's inverting input is loaded by the
  // divider's Rb (as in analyze()).
  const built = standardValueCompensator(request.compensator, request.parts);
  const comp = built.opamp && built.amplifier !== 'transconductance' && built.rb === undefined ? { ...built, rb: dividerRb(built.r1, request.feedback.vref, cv.vout) } : built;
  const { plantTransfer, grid } = loopPlant(request);
  const nominal = loopMargins(plantTransfer, grid, comp);

  const fc = new Float64Array(n);
  const pm = new Float64Array(n);
  const gm = new Float64Array(n);
  let nFc = 0;
  let nPm = 0;
  let nGm = 0;
  let meets = 0;
  const rnd = createRandom(options.seed);
  const rcMid = (range.rc.min + range.rc.max) / 2;
  const rcHalf = (range.rc.max - range.rc.min) / 2;
  const rt = tol.resistorTol;
  const ct = tol.capacitorTol;
  const stage = { ...request, converter: { ...cv } };
  const part = (v: number | undefined, t: number, u: number) => (v === undefined ? undefined : v * (1 + t * u));
  for (let i = 0; i < n; i++) {
    // Fixed draw order: L, C, ESR, R1, R2, R3, C1, C2, C3.
    stage.converter.l = cv.l * (1 + range.l.tol * drawUnit(rnd, normal));
    stage.converter.c = cv.c * (1 + range.c.tol * drawUnit(rnd, normal));
    // Uniform: the interval itself; normal: its centre ± half-width as ±3σ.
    stage.converter.rc = rcMid + rcHalf * drawUnit(rnd, normal);
    const r1u = drawUnit(rnd, normal);
    const r2u = drawUnit(rnd, normal);
    const r3u = drawUnit(rnd, normal);
    const c1u = drawUnit(rnd, normal);
    const c2u = drawUnit(rnd, normal);
    const c3u = drawUnit(rnd, normal);
    // Every other field of the compensator (amplifier, its model) is kept as entered.
    const sampled: CompensatorInput = {
      ...comp,
      r1: comp.r1 * (1 + rt * r1u),
      r2: part(comp.r2, rt, r2u),
      r3: part(comp.r3, rt, r3u),
      c1: comp.c1 * (1 + ct * c1u),
      c2: part(comp.c2, ct, c2u),
      c3: part(comp.c3, ct, c3u),
    };
    const m = loopMargins(loopPlantTransfer(stage), grid, sampled);
    if (m.crossoverHz !== null) fc[nFc++] = m.crossoverHz;
    if (m.phaseMarginDeg !== null) pm[nPm++] = m.phaseMarginDeg;
    if (m.gainMarginDb !== null) gm[nGm++] = m.gainMarginDb;
    if (m.phaseMarginDeg !== null && m.phaseMarginDeg >= targets.phaseMarginDeg && (m.gainMarginDb === null || m.gainMarginDb >= targets.gainMarginDb)) meets++;
    if (onProgress && (i + 1) % 250 === 0) onProgress(i + 1, n);
  }
  if (onProgress && n % 250 !== 0) onProgress(n, n);

  const bins = options.bins ?? 24;
  const summarize = (values: Float64Array, count: number) => {
    if (count === 0) return { percentiles: null, histogram: null };
    const sorted = values.subarray(0, count).sort();
    return {
      percentiles: { p1: percentileOfSorted(sorted, 1), p50: percentileOfSorted(sorted, 50), p99: percentileOfSorted(sorted, 99) },
      histogram: histogramOf(sorted, bins),
    };
  };
  const sFc = summarize(fc, nFc);
  const sPm = summarize(pm, nPm);
  const sGm = summarize(gm, nGm);
  return {
    samples: n,
    seed: options.seed,
    distribution,
    conditions: { vin: cv.vin, iout: cv.iout },
    tolerances: { l: range.l.tol, c: range.c.tol, rc: { ...range.rc }, resistorTol: rt, capacitorTol: ct },
    nominal: { crossoverHz: nominal.crossoverHz, phaseMarginDeg: nominal.phaseMarginDeg, gainMarginDb: nominal.gainMarginDb },
    percentiles: { crossoverHz: sFc.percentiles, phaseMarginDeg: sPm.percentiles, gainMarginDb: sGm.percentiles },
    histograms: { crossoverHz: sFc.histogram, phaseMarginDeg: sPm.histogram, gainMarginDb: sGm.histogram },
    missing: { crossoverHz: n - nFc, phaseMarginDeg: n - nPm, gainMarginDb: n - nGm },
    targets,
    meetsTargets: { count: meets, share: meets / n },
  };
};
