import { NextResponse } from 'next/server';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { anyJsonObject } from '@/lib/time-domain-api';
import { runSwitching } from '@/lib/switching-pool';
import { parseSwitchingRequest } from '@/lib/validation/time-domain';

/**
 * Switching-cycle simulation: a step cycle by cycle, or the loop gain from injections.
 * Work is estimated first; above the cycle limit the engine answers 422 naming the field.
 * The simulation runs in a worker thread (lib/switching-pool.ts), so other requests are
 * answered meanwhile; with too many runs waiting the answer is 503 with Retry-After.
 */
export const POST = withUser(async (req) => {
  const parsed = parseSwitchingRequest(await parseJson(req, anyJsonObject));
  if (!parsed.ok) throw new HttpError(400, 'The request does not fit the switching contract', parsed.issues);
  const { request, work } = parsed.data;
  const { body, via } = await runSwitching(request, work);
  return NextResponse.json(body, { headers: { 'x-phasewright-compute': via } });
});
