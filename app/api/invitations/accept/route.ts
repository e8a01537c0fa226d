import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { acceptInvitation, findInvitation } from '@/db/queries';
import { HttpError, parseJson, withOptionalUser } from '@/lib/api';
import { hashPasswordAsync } from '@/lib/password-hash';
import { acceptInvitationSchema } from '@/lib/validation/account';

/**
 * Accept an invitation: signed in as the invited address's account, or (no
 * account yet) with a name and password for a new one.
 */
export const POST = withOptionalUser(async (req, { user }) => {
  const body = await parseJson(req, acceptInvitationSchema);
  const db = getDb();
  const open = findInvitation(db, body.token);
  let newAccount: { name: string; passwordHash: string } | undefined;
  if (open && !open.hasAccount) {
    if (!body.name) throw new HttpError(422, 'Enter your name', [{ path: 'name', message: 'enter your name' }]);
    if (!body.password) throw new HttpError(422, 'Choose a password', [{ path: 'password', message: 'choose a password of at least 8 characters' }]);
    newAccount = { name: body.name, passwordHash: await hashPasswordAsync(body.password) };
  }
  const joined = acceptInvitation(db, body.token, { signedInUserId: user?.id ?? null, newAccount });
  return NextResponse.json({ teamId: joined.teamId, teamName: joined.teamName, role: joined.role, accountCreated: Boolean(newAccount) }, { status: 201 });
});
