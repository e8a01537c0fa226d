import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getRevision } from '@/db/queries';
import { HttpError, parseId, withUser } from '@/lib/api';
import { requireDesign } from '@/lib/design-access';

type P = { id: string; number: string };

export const GET = withUser<P>(async (_req, { user, params }) => {
  const design = requireDesign(user, params.id);
  const number = parseId(params.number, 'revision');
  const revision = getRevision(getDb(), design.id, number);
  if (!revision) throw new HttpError(404, `No revision r${number} of design ${design.id}`);
  return NextResponse.json(revision);
});
