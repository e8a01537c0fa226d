import { queryOptions } from '@tanstack/react-query';
import type { DesignPage } from '@/db/queries/designs';
import { requestJson } from './revisions';

/** One page of the designs list; `search` is the URL's query string (designListSearch). */
export const designListQueryOptions = (teamId: number, search: string) =>
  queryOptions({
    queryKey: ['designs', 'list', teamId, search] as const,
    queryFn: ({ signal }) => requestJson<DesignPage>(`/api/designs${search ? `?${search}` : ''}`, { signal }),
  });
