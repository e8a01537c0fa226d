/**
 * The sweep on Tune: its range as the designer sets it, and bench data against it. Bench
 * points outside the sweep are not drawn (the model has no curve there to compare with);
 * the screen offers to widen the sweep to cover them instead.
 */
import type { BenchOverlay } from '@/components/plot/bode-plot';
import type { SweepOptions } from '@/lib/engine/types';

/** Limits of the sweep control: a decade below 10 Hz up to 100 MHz, 20 to 5000 points. */
export const SWEEP_LIMITS = { minHz: 1, maxHz: 100e6, minPoints: 20, maxPoints: 5000 } as const;

export interface ClippedBench {
  /** The bench points inside the sweep (null when none is left). */
  shown: BenchOverlay | null;
  /** How many points lie below the sweep start and above its stop. */
  below: number;
  above: number;
}

/** Bench data clipped to [fStart, fStop]. */
export function clipBenchToSweep(bench: BenchOverlay, sweep: SweepOptions): ClippedBench {
  const keep: number[] = [];
  let below = 0;
  let above = 0;
  bench.f.forEach((f, i) => {
    if (f < sweep.fStart) below++;
    else if (f > sweep.fStop) above++;
    else keep.push(i);
  });
  if (below === 0 && above === 0) return { shown: bench, below, above };
  const pick = (a: number[]) => keep.map((i) => a[i]);
  return {
    shown: keep.length ? { ...bench, f: pick(bench.f), gainDb: pick(bench.gainDb), phaseDeg: pick(bench.phaseDeg) } : null,
    below,
    above,
  };
}

/**
 * The sweep widened to cover every bench point, with the same point density per decade
 * (rounded up, within SWEEP_LIMITS).
 */
export function sweepCovering(sweep: SweepOptions, bench: BenchOverlay): SweepOptions {
  const fs = bench.f.filter((f) => f > 0 && Number.isFinite(f));
  if (!fs.length) return sweep;
  const fStart = Math.max(SWEEP_LIMITS.minHz, Math.min(sweep.fStart, ...fs));
  const fStop = Math.min(SWEEP_LIMITS.maxHz, Math.max(sweep.fStop, ...fs));
  const perDecade = (sweep.points - 1) / Math.log10(sweep.fStop / sweep.fStart);
  const points = Math.min(SWEEP_LIMITS.maxPoints, Math.max(SWEEP_LIMITS.minPoints, Math.ceil(perDecade * Math.log10(fStop / fStart)) + 1));
  return { fStart, fStop, points };
}
