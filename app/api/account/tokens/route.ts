import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createApiToken, listApiTokens } from '@/db/queries';
import { parseJson, withUser } from '@/lib/api';
import { apiTokenCreateSchema } from '@/lib/validation/account';

/** Your personal API tokens (names and first characters only). */
export const GET = withUser(async (_req, { user }) => NextResponse.json({ tokens: listApiTokens(getDb(), user.id) }));

/** A new token, shown in this answer only; `Authorization: Bearer <token>` then acts as you. */
export const POST = withUser(async (req, { user }) => {
  const { name } = await parseJson(req, apiTokenCreateSchema);
  return NextResponse.json(createApiToken(getDb(), user.id, name), { status: 201 });
});
