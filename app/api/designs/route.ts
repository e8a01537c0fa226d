import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createDesign, getTeamSignoffSettings, listDesigns } from '@/db/queries';
import { mayReview } from '@/lib/signoff-policy';
import { can } from '@/lib/auth';
import { parseJson, parseQuery, withUser } from '@/lib/api';
import { designCreateSchema, designListQuerySchema } from '@/lib/validation/design';

/** Designs of the team: ?archived=active (default) | archived | all, ?waiting=me (in review, asking me). */
export const GET = withUser(async (req, { user }) => {
  const q = { data: parseQuery(req, designListQuerySchema) };
  const db = getDb();
  const waiting = q.data.waiting === 'me';
  const designs = listDesigns(db, user.teamId, {
    // Waiting for me: wherever it is (an archived design in review still waits).
    archived: waiting ? 'all' : q.data.archived,
    waitingForUserId: waiting ? user.id : undefined,
    reviewsUnnamed: waiting && mayReview(user.role, getTeamSignoffSettings(db, user.teamId)),
  });
  return NextResponse.json({ designs });
});

export const POST = withUser(
  async (req, { user }) => {
    const body = await parseJson(req, designCreateSchema);
    const design = createDesign(getDb(), user.id, user.teamId, body);
    return NextResponse.json(design, { status: 201 });
  },
  { allow: can.editDesigns, action: 'create designs' },
);
