import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getLatestRevision, updateDesign } from '@/db/queries';
import { can } from '@/lib/auth';
import { parseJson, withUser } from '@/lib/api';
import { requireDesign } from '@/lib/design-access';
import { designUpdateSchema } from '@/lib/validation/design';

type P = { id: string };

export const GET = withUser<P>(async (_req, { user, params }) => {
  const design = requireDesign(user, params.id);
  const latest = getLatestRevision(getDb(), design.id);
  return NextResponse.json({ ...design, latestRevision: latest?.number ?? null });
});

export const PATCH = withUser<P>(
  async (req, { user, params }) => {
    const design = requireDesign(user, params.id);
    const patch = await parseJson(req, designUpdateSchema);
    return NextResponse.json(updateDesign(getDb(), user.id, user.teamId, design.id, patch));
  },
  { allow: can.editDesigns, action: 'edit designs' },
);
