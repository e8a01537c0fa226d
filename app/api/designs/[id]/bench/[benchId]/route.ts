import { NextResponse } from 'next/server';
import { z } from 'zod';
import { getDb } from '@/db/client';
import { deleteBenchData, getBenchData, getRevision, setBenchPhaseShift } from '@/db/queries';
import { can } from '@/lib/auth';
import { HttpError, parseId, parseJson, withUser } from '@/lib/api';
import { requireDesign } from '@/lib/design-access';
import { analyze } from '@/lib/engine/analyze';
import { benchDetailBody } from '@/lib/handoff/bench-responses';
import { benchShiftedBody } from '@/lib/response-bodies';

type P = { id: string; benchId: string };

function requireBench(user: Parameters<typeof requireDesign>[0], params: P) {
  const design = requireDesign(user, params.id);
  const benchId = parseId(params.benchId, 'bench data');
  const bench = getBenchData(getDb(), user.teamId, design.id, benchId);
  if (!bench) throw new HttpError(404, `No bench data ${benchId} for design ${design.id}`);
  return { design, bench };
}

/**
 * One bench data set. `points` are as displayed: 180° taken off when phaseShifted, phase on
 * the branch of T. With ?revision=N also the model of that revision: its margins, the
 * model-minus-measured difference and the largest deviations.
 */
export const GET = withUser<P>(async (req, { user, params }) => {
  const { design, bench } = requireBench(user, params);
  const revParam = new URL(req.url).searchParams.get('revision');
  if (!revParam) return NextResponse.json(benchDetailBody(bench));
  const number = parseId(revParam, 'revision');
  const revision = getRevision(getDb(), design.id, number);
  if (!revision) throw new HttpError(404, `No revision r${number} of design ${design.id}`);
  const input = revision.input;
  // Sweep the model down to the lowest measured frequency (the averaged model stops at fsw/2).
  const fStart = Math.min(10, bench.points.f[0]);
  const result = analyze({ ...input, sweep: { fStart, fStop: input.converter.fsw / 2, points: 600 } });
  return NextResponse.json(benchDetailBody(bench, { revision: number, result }));
});

const patchSchema = z.object({ phaseShifted: z.boolean({ error: 'phaseShifted must be true or false' }) });

/** Set or clear the 180° shift for data measured as −T (the stored points stay as uploaded). */
export const PATCH = withUser<P>(
  async (req, { user, params }) => {
    const { design, bench } = requireBench(user, params);
    const body = await parseJson(req, patchSchema);
    setBenchPhaseShift(getDb(), user.id, user.teamId, design.id, bench.id, body.phaseShifted);
    return NextResponse.json(benchShiftedBody(bench.id, body.phaseShifted));
  },
  { allow: can.editDesigns, action: 'change bench data' },
);

export const DELETE = withUser<P>(
  async (_req, { user, params }) => {
    const { design, bench } = requireBench(user, params);
    deleteBenchData(getDb(), user.id, user.teamId, design.id, bench.id);
    return new Response(null, { status: 204 });
  },
  { allow: can.editDesigns, action: 'delete bench data' },
);
