import { queryOptions } from '@tanstack/react-query';
import type { RevisionPage, RevisionRow } from '@/db/queries/revisions';
import type { AnalyzeRequest } from '@/lib/engine/types';
import type { Jsonified } from '@/lib/json';
import type { SavedRevisionBody } from '@/lib/revision-summary';

/** Stable query keys for designs and their revisions; mutations invalidate these. */
export const designKeys = {
  all: ['designs'] as const,
  detail: (designId: number) => ['designs', designId] as const,
  revisions: (designId: number) => ['designs', designId, 'revisions'] as const,
  revisionPage: (designId: number, page: number) => ['designs', designId, 'revisions', 'page', page] as const,
  revision: (designId: number, number: number) => ['designs', designId, 'revisions', number] as const,
};

/** A revision as GET /api/designs/:id/revisions/:number answers it (with its input). */
export type RevisionDetail = Jsonified<RevisionRow>;

/** One page of GET /api/designs/:id/revisions (newest first, 100 a page, rows without their input). */
export type RevisionListPage = Jsonified<RevisionPage>;

/** A row of that page. */
export type RevisionListItem = RevisionListPage['revisions'][number];

/** What POST /api/designs/:id/revisions answers. */
export type SavedRevision = Jsonified<SavedRevisionBody>;

export interface SaveRevisionBody {
  baseRevision: number | null;
  note: string;
  input: AnalyzeRequest;
}

import { requestJson, sendJson } from './request';

/** What a revision picker shows of each revision (number, and note, author and date as its hint). */
export type RevisionBrief = Pick<RevisionListItem, 'number' | 'note' | 'authorName' | 'createdAt'>;
export type RevisionBriefPage = Omit<RevisionListPage, 'revisions'> & { revisions: RevisionBrief[] };

/** A page of revisions cut to what a picker shows (the server page hands its first page over the same way). */
export function briefPage(p: Omit<RevisionListPage, 'revisions'> & { revisions: (Omit<RevisionBrief, 'createdAt'> & { createdAt: string | Date })[] }): RevisionBriefPage {
  return {
    total: p.total,
    page: p.page,
    lastPage: p.lastPage,
    pageSize: p.pageSize,
    revisions: p.revisions.map((r) => ({
      number: r.number,
      note: r.note,
      authorName: r.authorName,
      createdAt: typeof r.createdAt === 'string' ? r.createdAt : r.createdAt.toISOString(),
    })),
  };
}

/** Page `page` (from 1) of a design's revisions, newest first, as pickers show them. */
export const revisionBriefPageQueryOptions = (designId: number, page: number) =>
  queryOptions({
    queryKey: [...designKeys.revisionPage(designId, page), 'brief'] as const,
    queryFn: async () => briefPage(await requestJson<RevisionListPage>(`/api/designs/${designId}/revisions?page=${page}`)),
  });

/** POST a new revision; throws ApiError (409 carries latestRevision). */
export const saveRevision = (designId: number, body: SaveRevisionBody) => sendJson<SavedRevision>(`/api/designs/${designId}/revisions`, 'POST', body);
