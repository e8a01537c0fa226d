import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createRevision, listRevisions } from '@/db/queries';
import { analyze } from '@/lib/engine/analyze';
import { can } from '@/lib/auth';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { requireActiveDesign, requireDesign } from '@/lib/design-access';
import { savedRevisionBody, summarizeAnalysis } from '@/lib/revision-summary';
import { revisionCreateSchema } from '@/lib/validation/revision';

type P = { id: string };

export const GET = withUser<P>(async (_req, { user, params }) => {
  const design = requireDesign(user, params.id);
  return NextResponse.json({ revisions: listRevisions(getDb(), design.id) });
});

/** Save a new immutable revision; the server re-runs the analysis it stores. */
export const POST = withUser<P>(
  async (req, { user, params }) => {
    const design = requireActiveDesign(user, params.id);
    const body = await parseJson(req, revisionCreateSchema);
    const input = body.input;
    if (input.converter.topology !== design.topology)
      throw new HttpError(422, 'The topology of a design cannot change', [
        { path: 'input.converter.topology', message: `this design is a ${design.topology}` },
      ]);
    const summary = summarizeAnalysis(analyze(input)); // throws EngineInputError → 422
    const row = createRevision(getDb(), {
      teamId: user.teamId,
      designId: design.id,
      baseNumber: body.baseRevision,
      input,
      summary,
      authorId: user.id,
      note: body.note,
    });
    return NextResponse.json(savedRevisionBody(row, summary), { status: 201 });
  },
  { allow: can.editDesigns, action: 'save revisions' },
);
