import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { getSignoffState, listRemarksPage, listSignoffEvents } from '@/db/queries';
import { withUser } from '@/lib/api';
import { requireRevision } from '@/lib/revision-access';

type P = { id: string; number: string };

/**
 * A revision's sign-off state, its events and its newest remarks (every role of the team may read):
 * `remarks` is the first page of …/remarks (newest first, up to 100), `remarkTotal` counts them all;
 * older ones are on …/remarks?page=N.
 */
export const GET = withUser<P>(async (_req, { user, params }) => {
  const { ref } = requireRevision(user, params);
  const db = getDb();
  return NextResponse.json({
    number: ref.number,
    state: getSignoffState(db, ref.revisionId),
    events: listSignoffEvents(db, ref.revisionId),
    ...remarksOf(listRemarksPage(db, ref.revisionId, 1)),
  });
});

const remarksOf = (page: ReturnType<typeof listRemarksPage>) => ({ remarks: page.remarks, remarkTotal: page.total });
