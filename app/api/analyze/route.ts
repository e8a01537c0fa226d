import { NextResponse } from 'next/server';
import { analyze } from '@/lib/engine/analyze';
import { parseJson, withUser } from '@/lib/api';
import { analyzeRequestSchema } from '@/lib/validation/analyze';

/** Analyse a power stage + compensator; any signed-in user may (it writes nothing). */
export const POST = withUser(async (req) => {
  const request = await parseJson(req, analyzeRequestSchema);
  return NextResponse.json(analyze(request));
});
