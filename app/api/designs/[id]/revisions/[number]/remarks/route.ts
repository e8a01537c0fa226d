import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { addRemark, listRemarks } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseJson, withUser } from '@/lib/api';
import { requireRevision } from '@/lib/revision-access';
import { remarkSchema } from '@/lib/validation/signoff';

type P = { id: string; number: string };

export const GET = withUser<P>(async (_req, { user, params }) => {
  const { ref } = requireRevision(user, params);
  return NextResponse.json({ remarks: listRemarks(getDb(), ref.revisionId) });
});

/** Attach a remark to a revision (designers, reviewers and admins; viewers only read). */
export const POST = withUser<P>(
  async (req, { user, params }) => {
    const { ref } = requireRevision(user, params);
    const body = await parseJson(req, remarkSchema);
    const row = addRemark(getDb(), { ...ref, authorId: user.id, body: body.body });
    return NextResponse.json({ ...row, authorName: user.name }, { status: 201 });
  },
  { allow: can.remark, action: 'write remarks' },
);
