import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { setDesignArchived } from '@/db/queries';
import { can } from '@/lib/auth';
import { withUser } from '@/lib/api';
import { requireDesign } from '@/lib/design-access';

type P = { id: string };

const answer = (d: { id: number; name: string; archivedAt: Date | null }) =>
  NextResponse.json({ id: d.id, name: d.name, archivedAt: d.archivedAt?.toISOString() ?? null });

/** Archive a design (designer, admin): hidden from the list, read-only; its revisions stay as they are. */
export const POST = withUser<P>(
  async (_req, { user, params }) => {
    const design = requireDesign(user, params.id);
    return answer(setDesignArchived(getDb(), user.id, user.teamId, design.id, true)!);
  },
  { allow: can.editDesigns, action: 'archive designs' },
);

/** Restore an archived design to the list. */
export const DELETE = withUser<P>(
  async (_req, { user, params }) => {
    const design = requireDesign(user, params.id);
    return answer(setDesignArchived(getDb(), user.id, user.teamId, design.id, false)!);
  },
  { allow: can.editDesigns, action: 'restore designs' },
);
