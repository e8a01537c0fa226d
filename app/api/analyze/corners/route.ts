import { NextResponse } from 'next/server';
import { z } from 'zod';
import { analyzeCorners, worstCaseChecks } from '@/lib/engine/corners';
import { defaultRange } from '@/lib/engine/range';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { cornersExtraSchema, parseWithAnalyze } from '@/lib/validation/range';

/** The design at every corner of its operating range; any signed-in user may (it writes nothing). */
export const POST = withUser(async (req) => {
  const parsed = parseWithAnalyze(await parseJson(req, z.unknown()), cornersExtraSchema);
  if (!parsed.ok) throw new HttpError(400, 'The request does not fit the corner-sweep contract', parsed.issues);
  const { request, extra } = parsed;
  const range = extra.range ?? defaultRange(request.converter);
  const result = analyzeCorners(request, range, { loop: extra.loop });
  return NextResponse.json({ range, ...result, checks: worstCaseChecks(result, extra.targets) });
});
