import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { deleteDesign, DesignDeleteRefusedError, getLatestRevision, updateDesign } from '@/db/queries';
import { can } from '@/lib/auth';
import { HttpError, parseJson, withUser } from '@/lib/api';
import { requireActiveDesign, requireDesign } from '@/lib/design-access';
import { designUpdateSchema } from '@/lib/validation/design';

type P = { id: string };

export const GET = withUser<P>(async (_req, { user, params }) => {
  const design = requireDesign(user, params.id);
  const latest = getLatestRevision(getDb(), design.id);
  return NextResponse.json({ ...design, latestRevision: latest?.number ?? null });
});

export const PATCH = withUser<P>(
  async (req, { user, params }) => {
    const design = requireActiveDesign(user, params.id);
    const patch = await parseJson(req, designUpdateSchema);
    return NextResponse.json(updateDesign(getDb(), user.id, user.teamId, design.id, patch));
  },
  { allow: can.editDesigns, action: 'edit designs' },
);

/**
 * Delete a design for good (designer, admin): only while nobody has reviewed it. A design with a
 * sign-off trail answers 409 and stays; archive it instead (POST …/archive).
 */
export const DELETE = withUser<P>(
  async (_req, { user, params }) => {
    const design = requireDesign(user, params.id);
    try {
      deleteDesign(getDb(), user.id, user.teamId, design.id);
    } catch (err) {
      if (err instanceof DesignDeleteRefusedError) throw new HttpError(409, err.message, [{ path: 'design', message: 'archive it instead' }]);
      throw err;
    }
    return new Response(null, { status: 204 });
  },
  { allow: can.editDesigns, action: 'delete designs' },
);
