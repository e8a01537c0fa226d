import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getUserById, setPasswordHash } from '@/db/queries';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { comparePassword, hashPasswordAsync } from '@/lib/password-hash';
import { passwordChangeSchema } from '@/lib/validation/account';

/** Change your password; every session of yours ends (sign in again with the new one). */
export const POST = withUser(async (req, { user }) => {
  const body = await parseJson(req, passwordChangeSchema);
  const db = getDb();
  const me = getUserById(db, user.id);
  if (!me || !(await comparePassword(body.currentPassword, me.passwordHash)))
    throw new HttpError(422, 'The current password is not right', [{ path: 'currentPassword', message: 'the current password is not right' }]);
  setPasswordHash(db, user.id, await hashPasswordAsync(body.newPassword));
  return NextResponse.json({ changed: true, sessionsEnded: true });
});
