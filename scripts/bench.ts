/**
 * Engine benchmark (`npm run bench`): median wall time of named cases, printed with targets.
 * Not a test: nothing fails on a slow machine. Add a case by pushing to BENCH_CASES.
 */
import { analyze, analyzeLoop, preparePlant } from '@/lib/engine/analyze';
import { partsFromShape, shapeFromParts } from '@/lib/engine/compensator';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { CompensatorShape } from '@/lib/engine/types';

export interface BenchCase {
  name: string;
  /** Target for the median, microseconds. */
  targetUs: number;
  /** Calls per timed batch (the batch time is divided by it). */
  batch: number;
  /** One call of the operation; `i` is the running call number. */
  run: (i: number) => unknown;
}

let sink: unknown;

/** Median of batch-mean times in µs after a warm-up. */
const measure = (c: BenchCase, batches = 200, warmup = 2000): { medianUs: number; p90Us: number } => {
  for (let i = 0; i < warmup; i++) sink = c.run(i);
  const times: number[] = [];
  let call = 0;
  for (let b = 0; b < batches; b++) {
    const t0 = process.hrtime.bigint();
    for (let k = 0; k < c.batch; k++) sink = c.run(call++);
    times.push(Number(process.hrtime.bigint() - t0) / 1e3 / c.batch);
  }
  times.sort((a, b) => a - b);
  return { medianUs: times[times.length >> 1], p90Us: times[Math.floor(times.length * 0.9)] };
};

const requests = SAMPLE_DESIGNS.map((s) => s.request);

/** Handle moves: each call nudges the integrator and the first zero, as a drag would. */
const dragCase = (): BenchCase => {
  const prepared = requests.map((r) => preparePlant(r));
  const shapes = requests.map((r) => shapeFromParts(r.compensator));
  return {
    name: 'drag: partsFromShape → analyzeLoop (400 points, margins, bode, checks)',
    targetUs: 16_000,
    batch: 10,
    run: (i) => {
      const k = i % prepared.length;
      const s: CompensatorShape = shapes[k];
      const wobble = 1 + 0.05 * Math.sin(i * 0.37);
      const comp = partsFromShape({ ...s, integratorHz: s.integratorHz * wobble, zerosHz: s.zerosHz.map((z, j) => (j === 0 ? z * wobble : z)) });
      return analyzeLoop(prepared[k], comp);
    },
  };
};

export const BENCH_CASES: BenchCase[] = [
  {
    name: 'full analyze() of the three sample designs (400 points, margins, snapped parts, checks)',
    targetUs: 50,
    batch: 10,
    run: (i) => analyze(requests[i % requests.length]),
  },
  dragCase(),
];

const main = () => {
  console.log(`Phasewright engine benchmark — node ${process.version}, ${SAMPLE_DESIGNS.length} sample designs`);
  for (const c of BENCH_CASES) {
    const { medianUs, p90Us } = measure(c);
    const verdict = medianUs <= c.targetUs ? 'within target' : 'ABOVE target';
    console.log(`- ${c.name}\n    median ${medianUs.toFixed(1)} µs, p90 ${p90Us.toFixed(1)} µs; target ${c.targetUs} µs: ${verdict}`);
  }
  if (sink === undefined) console.log('(nothing computed)');
};

main();
