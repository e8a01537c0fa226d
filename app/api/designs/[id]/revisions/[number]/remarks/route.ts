import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { addRemark, getRevision, listRemarksPage, remarkRecipients } from '@/db/queries';
import { PAGE_SIZE } from '@/lib/paging';
import { parsePageQuery } from '@/lib/validation/paging';
import { zodIssues } from '@/lib/validation/analyze';
import { can } from '@/lib/auth';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { mailEach, notifyRemark } from '@/lib/notify';
import { remarkBody } from '@/lib/response-bodies';
import { requireRevision } from '@/lib/revision-access';
import { remarkSchema } from '@/lib/validation/signoff';

type P = { id: string; number: string };

/**
 * A revision's remarks, newest first, 100 a page (`?page=N`, default 1; past the end serves the last page;
 * not a whole number from 1 → 400 naming `page`): `{ remarks, total, page, lastPage, pageSize }`.
 */
export const GET = withUser<P>(async (req, { user, params }) => {
  const { ref } = requireRevision(user, params);
  const query = parsePageQuery(new URL(req.url).searchParams);
  if (!query.success) throw new HttpError(400, 'The page asked for does not fit', zodIssues(query.error));
  const page = listRemarksPage(getDb(), ref.revisionId, query.data.page);
  return NextResponse.json({ ...page, pageSize: PAGE_SIZE });
});

/**
 * Attach a remark to a revision (designers, reviewers and admins; viewers only read), with
 * `comparedWith` when written on Compare. The revision's author and its reviewer get a mail
 * (not the writer).
 */
export const POST = withUser<P>(
  async (req, { user, params }) => {
    const { design, ref } = requireRevision(user, params);
    const body = await parseJson(req, remarkSchema);
    const db = getDb();
    if (body.comparedWith !== undefined && !getRevision(db, design.id, body.comparedWith))
      throw new HttpError(422, `There is no r${body.comparedWith} to compare with`, [{ path: 'comparedWith', message: `no revision r${body.comparedWith} in this design` }]);
    const row = addRemark(db, { ...ref, authorId: user.id, body: body.body, comparedWith: body.comparedWith ?? null });
    const revision = { designId: design.id, designName: design.name, number: ref.number };
    const mailed = await mailEach(db, remarkRecipients(db, ref.revisionId, user.id), (to) =>
      notifyRemark({ to, by: user.name, teamId: user.teamId, revision, comparedWith: row.comparedWith, body: body.body }),
    );
    return NextResponse.json(remarkBody(row, user.name, mailed), { status: 201 });
  },
  { allow: can.remark, action: 'write remarks' },
);
