/**
 * The bodies the bench data routes answer, built here so the client's fetchers
 * (lib/queries/bench.ts) import their types instead of restating them.
 */
import type { AnalyzeResult } from '@/lib/engine/types';
import { compareBench, displayBenchPoints, measureMargins, type MeasuredMargins } from './bench-compare';
import { inspectLowFrequencyPhase, type BenchParseResult, type BenchPoints } from './bench-parse';

/** A stored bench data set as the list answers it (no points). */
export interface BenchSummaryRow {
  id: number;
  designId: number;
  /** The revision measured; null for design-wide data from before bench data had a revision. */
  revisionId: number | null;
  revisionNumber: number | null;
  name: string;
  phaseShifted: boolean;
  uploadedBy: number;
  uploaderName: string;
  createdAt: Date;
}

/** The answer to an upload: what was read, assumed and measured. */
export function benchUploadedBody(id: number, name: string, phaseShifted: boolean, parsed: BenchParseResult) {
  return {
    id,
    name,
    rows: parsed.rows,
    frequencyUnit: parsed.frequencyUnit,
    notes: parsed.notes,
    looksInverted: parsed.looksInverted,
    lowFrequencyPhaseDeg: parsed.lowFrequencyPhaseDeg,
    phaseShifted,
    measured: measureMargins(displayBenchPoints(parsed.points, phaseShifted)),
  };
}

export interface BenchDetailBody extends Omit<BenchSummaryRow, 'uploadedBy'> {
  points: BenchPoints;
  measured: MeasuredMargins;
  /** Of the data as uploaded: phase near +90° at low frequency (measured as −T). */
  looksInverted: boolean;
  lowFrequencyPhaseDeg: number;
  /** Present when asked with a revision. */
  revision?: number;
  difference?: BenchPoints;
  largestGainDifferenceDb?: number | null;
  largestPhaseDifferenceDeg?: number | null;
  model?: {
    crossoverHz: number | null;
    phaseMarginDeg: number | null;
    gainMarginDb: number | null;
    bode: { f: number[]; magDb: number[]; phaseDeg: number[] };
  };
}

/**
 * One bench data set. `points` are as displayed: 180° taken off when phaseShifted, phase on
 * the branch of T. With a model (a revision's analysis) also its margins, the
 * model-minus-measured difference and the largest deviations.
 */
export function benchDetailBody(
  bench: BenchSummaryRow & { points: BenchPoints },
  model?: { revision: number; result: Pick<AnalyzeResult, 'margins' | 'bode'> },
): BenchDetailBody {
  const base = {
    id: bench.id,
    designId: bench.designId,
    revisionId: bench.revisionId,
    revisionNumber: bench.revisionNumber,
    name: bench.name,
    phaseShifted: bench.phaseShifted,
    uploaderName: bench.uploaderName,
    createdAt: bench.createdAt,
    // Of the data as uploaded: near +90° at low frequency means measured as −T.
    ...inspectLowFrequencyPhase(bench.points.phaseDeg),
  };
  if (!model) {
    const points = displayBenchPoints(bench.points, bench.phaseShifted);
    return { ...base, points, measured: measureMargins(points) };
  }
  const { margins, bode } = model.result;
  const trace = { f: bode.f, magDb: bode.loop.magDb, phaseDeg: bode.loop.phaseDeg };
  return {
    ...base,
    ...compareBench(bench.points, bench.phaseShifted, trace),
    revision: model.revision,
    model: {
      crossoverHz: margins.crossoverHz,
      phaseMarginDeg: margins.phaseMarginDeg,
      gainMarginDb: margins.gainMarginDb,
      bode: trace,
    },
  };
}

export type BenchUploadedBody = ReturnType<typeof benchUploadedBody>;
