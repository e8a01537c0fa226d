import { NextResponse } from 'next/server';
import { z } from 'zod';
import { defaultRange } from '@/lib/engine/range';
import { runSpread } from '@/lib/engine/spread';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { parseWithAnalyze, spreadExtraSchema } from '@/lib/validation/range';

/**
 * Monte Carlo over the design's tolerances. Bounded work: more samples than the engine's
 * limit answer 422. Without a seed one is drawn and returned, so the result can be repeated.
 */
export const POST = withUser(async (req) => {
  const parsed = parseWithAnalyze(await parseJson(req, z.unknown()), spreadExtraSchema);
  if (!parsed.ok) throw new HttpError(400, 'The request does not fit the spread contract', parsed.issues);
  const { request, extra } = parsed;
  const range = extra.range ?? defaultRange(request.converter);
  const seed = extra.seed ?? Math.floor(Math.random() * 2 ** 31);
  const result = runSpread(request, range, { samples: extra.samples, seed, distribution: extra.distribution, targets: extra.targets });
  return NextResponse.json({ range, ...result });
});
