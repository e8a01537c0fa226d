import { analyze } from '@/lib/engine/analyze';
import type { AnalyzeRequest } from '@/lib/engine/types';

/**
 * A bench data file as an analyzer might export it, made from the model of `request`:
 * `points` log-spaced rows from fStart to fStop with a gain offset, a phase offset, and
 * optionally the sign of −T (phase + 180°). Columns: Frequency (Hz), Gain (dB), Phase (deg).
 */
export function benchCsvFor(
  request: AnalyzeRequest,
  opts: { points?: number; fStart?: number; fStop?: number; gainOffsetDb?: number; phaseOffsetDeg?: number; invert?: boolean; separator?: string } = {},
): string {
  const fStart = opts.fStart ?? 20;
  const fStop = opts.fStop ?? request.converter.fsw / 2;
  const points = opts.points ?? 120;
  const sep = opts.separator ?? ',';
  const bode = analyze({ ...request, sweep: { fStart, fStop, points } }).bode;
  const lines = [['Frequency (Hz)', 'Gain (dB)', 'Phase (deg)'].join(sep)];
  bode.f.forEach((f, i) => {
    const phase = bode.loop.phaseDeg[i] + (opts.phaseOffsetDeg ?? 0) + (opts.invert ? 180 : 0);
    lines.push([f.toPrecision(6), (bode.loop.magDb[i] + (opts.gainOffsetDb ?? 0)).toFixed(3), phase.toFixed(2)].join(sep));
  });
  return lines.join('\n') + '\n';
}
