import { NextResponse } from 'next/server';
import { analyze } from '@/lib/engine/analyze';
import { HttpError, withUser } from '@/lib/api';
import { parseAnalyzeRequest } from '@/lib/validation/analyze';

/** Analyse a power stage + compensator; any signed-in user may (it writes nothing). */
export const POST = withUser(async (req) => {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new HttpError(400, 'The request body is not valid JSON', [{ path: '(body)', message: 'expected a JSON object' }]);
  }
  const parsed = parseAnalyzeRequest(body);
  if (!parsed.ok) throw new HttpError(400, 'The request does not fit the analysis contract', parsed.issues);
  return NextResponse.json(analyze(parsed.data));
});
