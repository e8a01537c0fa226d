import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getTeamSignoffSettings, setTeamSignoffSettings } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseJson, withUser } from '@/lib/api';
import { teamSettingsSchema } from '@/lib/validation/team-settings';

/** The current team's sign-off settings (every member may read them). */
export const GET = withUser(async (_req, { user }) => NextResponse.json(getTeamSignoffSettings(getDb(), user.teamId)));

/** An admin sets whether the team's admins may review and decide sign-offs. */
export const PUT = withUser(
  async (req, { user }) => {
    const body = await parseJson(req, teamSettingsSchema);
    const db = getDb();
    setTeamSignoffSettings(db, user.id, user.teamId, body);
    return NextResponse.json(getTeamSignoffSettings(db, user.teamId));
  },
  { allow: can.manageTeam, action: 'change the team settings' },
);
