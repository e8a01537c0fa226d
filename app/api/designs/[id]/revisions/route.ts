import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createRevision, listRevisionPage } from '@/db/queries';
import { analyze } from '@/lib/engine/analyze';
import { can } from '@/lib/auth';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { requireActiveDesign, requireDesign } from '@/lib/design-access';
import { savedRevisionBody, summarizeAnalysis } from '@/lib/revision-summary';
import { parsePageQuery } from '@/lib/validation/paging';
import { revisionCreateSchema } from '@/lib/validation/revision';
import { zodIssues } from '@/lib/validation/analyze';

type P = { id: string };

/**
 * A design's revisions, newest first, 100 a page (`?page=N`, default 1; past the end serves the last page):
 * `{ revisions, total, page, lastPage, pageSize }`, each row without its input (GET …/revisions/:n has it).
 */
export const GET = withUser<P>(async (req, { user, params }) => {
  const design = requireDesign(user, params.id);
  const query = parsePageQuery(new URL(req.url).searchParams);
  if (!query.success) throw new HttpError(400, 'The page asked for does not fit', zodIssues(query.error));
  return NextResponse.json(listRevisionPage(getDb(), design.id, query.data.page));
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
