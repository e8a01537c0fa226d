import { NextResponse } from 'next/server';
import { analyze } from '@/lib/engine/analyze';
import { roundBode } from '@/lib/engine/precision';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { analyzeBodySchema, arraysWanted } from '@/lib/validation/analyze';

/**
 * Analyse a power stage + compensator; any signed-in user may (it writes nothing).
 * Bode arrays come rounded to 6 significant digits; `?arrays=0` or `output: { arrays: false }`
 * leaves them out.
 */
export const POST = withUser(async (req) => {
  const { output, ...request } = await parseJson(req, analyzeBodySchema);
  const wanted = arraysWanted(new URL(req.url), output.arrays);
  if (!wanted.ok) throw new HttpError(400, 'The request does not fit the analysis contract', wanted.issues);
  const { bode, ...rest } = analyze(request);
  return NextResponse.json(wanted.arrays ? { ...rest, bode: roundBode(bode) } : rest);
});
