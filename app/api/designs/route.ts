import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createDesign, listDesigns } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseJson, withUser } from '@/lib/api';
import { designCreateSchema } from '@/lib/validation/design';

export const GET = withUser(async (_req, { user }) => {
  return NextResponse.json({ designs: listDesigns(getDb(), user.teamId) });
});

export const POST = withUser(
  async (req, { user }) => {
    const body = await parseJson(req, designCreateSchema);
    const design = createDesign(getDb(), user.id, user.teamId, body);
    return NextResponse.json(design, { status: 201 });
  },
  { allow: can.editDesigns, action: 'create designs' },
);
