import { queryOptions } from '@tanstack/react-query';
import type { z } from 'zod';
import type { DesignPage, updateDesign } from '@/db/queries/designs';
import type { Jsonified } from '@/lib/json';
import type { ImportedDesignBody } from '@/lib/response-bodies';
import type { designUpdateSchema } from '@/lib/validation/design';
import { requestJson, sendJson } from './request';

/** One page of the designs list; `search` is the URL's query string (designListSearch). */
export const designListQueryOptions = (teamId: number, search: string) =>
  queryOptions({
    queryKey: ['designs', 'list', teamId, search] as const,
    queryFn: ({ signal }) => requestJson<Jsonified<DesignPage>>(`/api/designs${search ? `?${search}` : ''}`, { signal }),
  });

/** PATCH a design's name, description or designator mapping. */
export const updateDesignRequest = (designId: number, body: z.input<typeof designUpdateSchema>) =>
  sendJson<Jsonified<ReturnType<typeof updateDesign>>>(`/api/designs/${designId}`, 'PATCH', body);

/** Archive (true) or restore (false). */
export const archiveDesignRequest = (designId: number, archived: boolean) => sendJson<unknown>(`/api/designs/${designId}/archive`, archived ? 'POST' : 'DELETE');

/** Delete for good (refused with 409 once anybody reviewed it). */
export const deleteDesignRequest = (designId: number) => sendJson<unknown>(`/api/designs/${designId}`, 'DELETE');

/** A design file's text as it is (the route reads the JSON itself, to name a bad path). */
export const importDesignRequest = (fileText: string) =>
  requestJson<Jsonified<ImportedDesignBody>>('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: fileText });
