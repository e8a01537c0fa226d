import { queryOptions } from '@tanstack/react-query';
import type { RevisionRow } from '@/db/queries/revisions';
import type { AnalyzeRequest } from '@/lib/engine/types';
import type { Jsonified } from '@/lib/json';
import type { SavedRevisionBody } from '@/lib/revision-summary';

/** Stable query keys for designs and their revisions; mutations invalidate these. */
export const designKeys = {
  all: ['designs'] as const,
  detail: (designId: number) => ['designs', designId] as const,
  revisions: (designId: number) => ['designs', designId, 'revisions'] as const,
  revision: (designId: number, number: number) => ['designs', designId, 'revisions', number] as const,
};

/** A revision as GET /api/designs/:id/revisions(/:number) answers it. */
export type RevisionListItem = Jsonified<RevisionRow>;

/** What POST /api/designs/:id/revisions answers. */
export type SavedRevision = Jsonified<SavedRevisionBody>;

export interface SaveRevisionBody {
  baseRevision: number | null;
  note: string;
  input: AnalyzeRequest;
}

export { ApiError, requestJson } from './request';
import { requestJson } from './request';

export const revisionsQueryOptions = (designId: number) =>
  queryOptions({
    queryKey: designKeys.revisions(designId),
    queryFn: () => requestJson<{ revisions: RevisionListItem[] }>(`/api/designs/${designId}/revisions`),
  });

/** POST a new revision; throws ApiError (409 carries latestRevision). */
export const saveRevision = (designId: number, body: SaveRevisionBody) =>
  requestJson<SavedRevision>(`/api/designs/${designId}/revisions`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
