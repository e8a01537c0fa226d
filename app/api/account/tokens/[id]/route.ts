import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { revokeApiToken } from '@/db/queries';
import { HttpError, parseId, withUser } from '@/lib/api';

/** Revoke one of your tokens; it stops working at once. */
export const DELETE = withUser<{ id: string }>(async (_req, { user, params }) => {
  if (!revokeApiToken(getDb(), user.id, parseId(params.id, 'token'))) throw new HttpError(404, 'No such token of yours');
  return NextResponse.json({ revoked: true });
});
