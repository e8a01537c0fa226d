import 'server-only';
import { getDb } from '@/db/client';
import { getDesign } from '@/db/queries';
import { HttpError, parseId } from './api';
import type { CurrentUser } from './auth';

/** The design named by a route param, only within the user's current team (else 404). */
export function requireDesign(user: CurrentUser, idParam: string | undefined) {
  const id = parseId(idParam, 'design');
  const design = getDesign(getDb(), user.teamId, id);
  if (!design) throw new HttpError(404, `No design ${id} in team ${user.teamName}`);
  return design;
}

/** As requireDesign, for changes: an archived design is read-only until restored (409). */
export function requireActiveDesign(user: CurrentUser, idParam: string | undefined) {
  const design = requireDesign(user, idParam);
  if (design.archivedAt)
    throw new HttpError(409, `“${design.name}” is archived; restore it before changing it`, [{ path: 'design', message: 'the design is archived' }]);
  return design;
}
