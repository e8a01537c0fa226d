import { NextResponse } from 'next/server';
import { z } from 'zod';
import { TEAM_COOKIE } from '@/lib/auth';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { teamSwitchedBody } from '@/lib/response-bodies';

const bodySchema = z.object({ teamId: z.number({ error: 'teamId must be a number' }).int().positive() });

/** Switch the current team; only to a team the user belongs to. */
export const POST = withUser(async (req, { user }) => {
  const { teamId } = await parseJson(req, bodySchema);
  const team = user.teams.find((t) => t.teamId === teamId);
  if (!team) throw new HttpError(403, 'You are not a member of that team');
  const res = NextResponse.json(teamSwitchedBody(teamId, team.role));
  res.cookies.set(TEAM_COOKIE, String(teamId), { httpOnly: true, sameSite: 'lax', path: '/' });
  return res;
});
