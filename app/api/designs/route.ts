import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createDesign } from '@/db/queries';
import { designsListJson } from '@/lib/designs-list-cache';
import { can } from '@/lib/auth';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { designCreateSchema, parseDesignListQuery } from '@/lib/validation/design';
import { zodIssues } from '@/lib/validation/analyze';

/**
 * One page (100 rows) of the team's designs: ?q, topology, status, sort, dir, page,
 * archived=active (default) | archived | all, waiting=me (in review, asking me).
 */
export const GET = withUser(async (req, { user }) => {
  const query = parseDesignListQuery(new URL(req.url).searchParams);
  if (!query.success) throw new HttpError(400, 'The list parameters do not fit', zodIssues(query.error));
  const body = designsListJson(getDb(), { teamId: user.teamId, userId: user.id, role: user.role }, query.data);
  return new NextResponse(body, { headers: { 'content-type': 'application/json' } });
});

export const POST = withUser(
  async (req, { user }) => {
    const body = await parseJson(req, designCreateSchema);
    const design = createDesign(getDb(), user.id, user.teamId, body);
    return NextResponse.json(design, { status: 201 });
  },
  { allow: can.editDesigns, action: 'create designs' },
);
