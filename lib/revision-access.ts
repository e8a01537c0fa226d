import 'server-only';
import { getDb } from '@/db/client';
import { getRevision, SignoffForbiddenError, SignoffRuleError } from '@/db/queries';
import { HttpError, parseId } from './api';
import type { CurrentUser } from './auth';
import { requireDesign } from './design-access';

/** The design and revision named by route params, within the user's team (else 404). */
export function requireRevision(user: CurrentUser, params: { id: string; number: string }) {
  const design = requireDesign(user, params.id);
  const number = parseId(params.number, 'revision');
  const revision = getRevision(getDb(), design.id, number);
  if (!revision) throw new HttpError(404, `No revision r${number} of design ${design.id}`);
  const ref = { teamId: user.teamId, designId: design.id, revisionId: revision.id, number };
  return { design, revision, ref };
}

/** Sign-off rule errors as HTTP: a forbidden step → 403, a broken rule → 422 naming the field. */
export function runSignoff<T>(fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof SignoffForbiddenError) throw new HttpError(403, err.message);
    if (err instanceof SignoffRuleError) throw new HttpError(422, err.message, [{ path: err.field, message: err.message }]);
    throw err;
  }
}
