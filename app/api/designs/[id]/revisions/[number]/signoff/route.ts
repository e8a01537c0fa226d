import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getSignoffState, listRemarks, listSignoffEvents } from '@/db/queries';
import { withUser } from '@/lib/api';
import { requireRevision } from '@/lib/revision-access';

type P = { id: string; number: string };

/** A revision's sign-off state, its events and its remarks (every role of the team may read). */
export const GET = withUser<P>(async (_req, { user, params }) => {
  const { ref } = requireRevision(user, params);
  const db = getDb();
  return NextResponse.json({
    number: ref.number,
    state: getSignoffState(db, ref.revisionId),
    events: listSignoffEvents(db, ref.revisionId),
    remarks: listRemarks(db, ref.revisionId),
  });
});
