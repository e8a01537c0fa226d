import { NextResponse } from 'next/server';
import { closedLoopResponses } from '@/lib/engine/closed-loop';
import { preparePlant } from '@/lib/engine/analyze';
import { roundSignificant } from '@/lib/engine/precision';
import { simulateStepResponse } from '@/lib/engine/step-response';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { anyJsonObject, roundAll } from '@/lib/time-domain-api';
import { parseTransientRequest } from '@/lib/validation/time-domain';

/**
 * Load or line step of the averaged loop, with the closed-loop read-outs; any signed-in user
 * may (it writes nothing). Bounded work: a fixed number of points, at most four windows.
 */
export const POST = withUser(async (req) => {
  const parsed = parseTransientRequest(await parseJson(req, anyJsonObject));
  if (!parsed.ok) throw new HttpError(400, 'The request does not fit the transient contract', parsed.issues);
  const { request, step } = parsed.data;
  const r = simulateStepResponse(request, step);
  const cl = closedLoopResponses(preparePlant(request), request.compensator);
  return NextResponse.json({
    kind: r.kind,
    t: roundAll(r.t),
    vout: roundAll(r.vout),
    duty: r.duty ? roundAll(r.duty) : null,
    peakDeviation: r.peakDeviation,
    overshoot: r.overshoot,
    settlingTime: r.settlingTime,
    finalVout: r.finalVout,
    band: r.band,
    outsideModel: r.outsideModel,
    closedLoop: {
      zoutClosedPeakOhm: roundSignificant(cl.zoutClosedPeakOhm),
      zoutClosedPeakHz: roundSignificant(cl.zoutClosedPeakHz),
      lineRejectionAtFswDb: roundSignificant(cl.lineRejectionAtFswDb),
      lineRejectionAtMainsDb: roundSignificant(cl.lineRejectionAtMainsDb),
      mainsRippleHz: cl.mainsRippleHz,
    },
  });
});
