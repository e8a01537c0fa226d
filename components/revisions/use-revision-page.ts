'use client';

import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { revisionBriefPageQueryOptions, type RevisionBriefPage } from '@/lib/queries/revisions';

/**
 * One page of a design's revisions (newest first, 100 a page) for a picker: starts on the page the
 * server rendered (`initial`, the one holding the revision shown) and pages through the API with
 * TanStack Query, keeping the previous page on screen while the next one loads.
 */
export function useRevisionPage(designId: number, initial: RevisionBriefPage) {
  const [page, setPage] = useState(initial.page);
  const query = useQuery({
    ...revisionBriefPageQueryOptions(designId, page),
    initialData: page === initial.page ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const data = query.data ?? initial;
  return {
    data,
    page,
    /** Newest and oldest number on the page shown (null for a design without revisions). */
    range: data.revisions.length > 0 ? { newest: data.revisions[0].number, oldest: data.revisions[data.revisions.length - 1].number } : null,
    newer: page > 1 ? () => setPage(page - 1) : null,
    older: page < data.lastPage ? () => setPage(page + 1) : null,
    /** Show the page holding revision n (numbers run 1…latest without gaps, so it is known without asking). */
    goTo: (n: number) => setPage(Math.floor(Math.max(0, data.total - n) / data.pageSize) + 1),
    loading: query.isFetching && query.isPlaceholderData,
    isError: query.isError,
  };
}
