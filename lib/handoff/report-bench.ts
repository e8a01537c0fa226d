/**
 * One bench data set against the model of the revision it was measured on, as the printable
 * report shows it: measured and model margins, the largest differences, and the points for the
 * overlay plot. Pure (runs the engine; no DB).
 */
import { analyze } from '@/lib/engine/analyze';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { compareBench, type BenchComparison } from './bench-compare';
import type { BenchPoints } from './bench-parse';

export interface StoredBench {
  name: string;
  uploaderName: string;
  createdAt: Date;
  /** The revision measured; null for design-wide data. */
  revisionNumber: number | null;
  phaseShifted: boolean;
  points: BenchPoints;
}

export interface ReportBench extends BenchComparison {
  name: string;
  uploaderName: string;
  createdAt: Date;
  revisionNumber: number | null;
  phaseShifted: boolean;
  model: {
    crossoverHz: number | null;
    phaseMarginDeg: number | null;
    gainMarginDb: number | null;
    bode: { f: number[]; loop: { magDb: number[]; phaseDeg: number[] } };
  };
}

/** The model is swept from the lowest measured frequency (or 10 Hz) to fsw/2, where the averaged model stops. */
export function benchForReport(input: AnalyzeRequest, bench: StoredBench): ReportBench {
  const fStart = Math.min(10, bench.points.f[0] ?? 10);
  const fStop = Math.max(input.sweep?.fStop ?? 0, input.converter.fsw / 2);
  const model = analyze({ ...input, sweep: { fStart, fStop, points: 400 } });
  const cmp = compareBench(bench.points, bench.phaseShifted, { f: model.bode.f, magDb: model.bode.loop.magDb, phaseDeg: model.bode.loop.phaseDeg });
  return {
    ...cmp,
    name: bench.name,
    uploaderName: bench.uploaderName,
    createdAt: bench.createdAt,
    revisionNumber: bench.revisionNumber,
    phaseShifted: bench.phaseShifted,
    model: {
      crossoverHz: model.margins.crossoverHz,
      phaseMarginDeg: model.margins.phaseMarginDeg,
      gainMarginDb: model.margins.gainMarginDb,
      bode: { f: model.bode.f, loop: model.bode.loop },
    },
  };
}
