import { NextResponse } from 'next/server';
import { modelCheck, switchingStep } from '@/lib/engine/switching-check';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { anyJsonObject, roundAll, roundWaveform } from '@/lib/time-domain-api';
import { parseSwitchingRequest } from '@/lib/validation/time-domain';

/**
 * Switching-cycle simulation: a step cycle by cycle, or the loop gain from injections.
 * Work is estimated first; above the cycle limit the engine answers 422 naming the field.
 */
export const POST = withUser(async (req) => {
  const parsed = parseSwitchingRequest(await parseJson(req, anyJsonObject));
  if (!parsed.ok) throw new HttpError(400, 'The request does not fit the switching contract', parsed.issues);
  const { request, work } = parsed.data;
  if (work.kind === 'step') {
    const r = switchingStep(request, work.step);
    return NextResponse.json({
      kind: 'step',
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
    });
  }
  const r = modelCheck(request, work.frequencies);
  return NextResponse.json({ kind: 'injection', cycleCount: r.cycleCount, steadyState: r.steadyState, waveform: roundWaveform(r.waveform), points: r.points });
});
