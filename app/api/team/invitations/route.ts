import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createInvitation, listOpenInvitations } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseJson, withUser } from '@/lib/api';
import { notifyInvitation } from '@/lib/notify';
import { invitationSentBody } from '@/lib/response-bodies';
import { invitationSchema } from '@/lib/validation/account';

/** Open invitations of the current team (admins). */
export const GET = withUser(async (_req, { user }) => NextResponse.json({ invitations: listOpenInvitations(getDb(), user.teamId) }), {
  allow: can.manageTeam,
  action: 'see invitations',
});

/**
 * Invite an e-mail address to the team with a role. The answer is the same
 * whether or not the address has an account: the admin never learns which.
 */
export const POST = withUser(
  async (req, { user }) => {
    const body = await parseJson(req, invitationSchema);
    const { token } = createInvitation(getDb(), user.id, user.teamId, body);
    await notifyInvitation({ to: body.email, teamId: user.teamId, teamName: user.teamName, role: body.role, by: user.name, token });
    return NextResponse.json(invitationSentBody(body.email, body.role), { status: 201 });
  },
  { allow: can.manageTeam, action: 'invite members' },
);
