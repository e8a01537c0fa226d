import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { removeTeamMember } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseId, withUser } from '@/lib/api';

/** Remove a member from the team (admins); their sessions end at once. */
export const DELETE = withUser<{ userId: string }>(
  async (_req, { user, params }) => {
    removeTeamMember(getDb(), user.id, user.teamId, parseId(params.userId, 'member'));
    return NextResponse.json({ removed: true });
  },
  { allow: can.manageTeam, action: 'remove members' },
);
