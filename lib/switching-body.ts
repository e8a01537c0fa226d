/**
 * The answer of POST /api/analyze/switching for a parsed request: the simulation and its
 * arrays rounded as the other analysis answers are. Pure (no server imports), so the worker
 * thread (lib/switching-thread.ts) and the inline fallback build the same body.
 */
import { modelCheck, switchingStep } from '@/lib/engine/switching-check';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { roundAll, roundWaveform } from '@/lib/time-domain-api';
import type { SwitchingWork } from '@/lib/validation/time-domain';

export function switchingBody(request: AnalyzeRequest, work: SwitchingWork) {
  if (work.kind === 'step') {
    const r = switchingStep(request, work.step);
    return {
      kind: 'step' as const,
      cycleCount: r.cycleCount,
      steadyState: r.steadyState,
      averaged: { t: roundAll(r.averaged.t), vout: roundAll(r.averaged.vout), peakDeviation: r.averaged.peakDeviation },
      cycles: {
        t: roundAll(r.cycles.t),
        voutAvg: roundAll(r.cycles.voutAvg),
        voutMin: roundAll(r.cycles.voutMin),
        voutMax: roundAll(r.cycles.voutMax),
        duty: roundAll(r.cycles.duty),
      },
      waveform: roundWaveform(r.waveform),
      outsideModel: [...r.averaged.outsideModel, ...r.outsideModel],
    };
  }
  const r = modelCheck(request, work.frequencies);
  return { kind: 'injection' as const, cycleCount: r.cycleCount, steadyState: r.steadyState, waveform: roundWaveform(r.waveform), points: r.points };
}

export type SwitchingBody = ReturnType<typeof switchingBody>;
