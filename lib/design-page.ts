import 'server-only';
import { notFound } from 'next/navigation';
import { getDb } from '@/db/client';
import { getDesign } from '@/db/queries';
import { requireUser } from './auth';

/** For pages under /designs/[id]: the signed-in user, the database and the design of their team (else 404). */
export async function loadDesignPage(idParam: string) {
  const user = await requireUser();
  const db = getDb();
  const design = /^\d+$/.test(idParam) ? getDesign(db, user.teamId, Number(idParam)) : undefined;
  if (!design) notFound();
  return { user, db, design };
}
