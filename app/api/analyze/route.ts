import { NextResponse } from 'next/server';
import { analyze } from '@/lib/engine/analyze';
import { roundBode } from '@/lib/engine/precision';
import { HttpError, withUser } from '@/lib/api';
import { parseAnalyzeOutput, parseAnalyzeRequest } from '@/lib/validation/analyze';

/**
 * Analyse a power stage + compensator; any signed-in user may (it writes nothing).
 * Bode arrays come rounded to 6 significant digits; `?arrays=0` or `output: { arrays: false }`
 * leaves them out.
 */
export const POST = withUser(async (req) => {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new HttpError(400, 'The request body is not valid JSON', [{ path: '(body)', message: 'expected a JSON object' }]);
  }
  const output = parseAnalyzeOutput(body, new URL(req.url));
  const parsed = parseAnalyzeRequest(body);
  const issues = [...(output.ok ? [] : output.issues), ...(parsed.ok ? [] : parsed.issues)];
  if (!parsed.ok || !output.ok) throw new HttpError(400, 'The request does not fit the analysis contract', issues);
  const { bode, ...rest } = analyze(parsed.data);
  return NextResponse.json(output.data.arrays ? { ...rest, bode: roundBode(bode) } : rest);
});
