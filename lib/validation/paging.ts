import { z } from 'zod';

/**
 * `?page=N` of the paged list routes (a design's revisions, a revision's remarks): a whole number
 * from 1, else 400 naming `page` (as GET /api/designs); past the last page the last one is served. Pages (History,
 * Compare) read their own `page` parameters leniently with `pageParam` (lib/paging.ts).
 */
export const pageQuerySchema = z.object({
  page: z.coerce.number({ error: 'page must be a number' }).int('page must be a whole number').min(1, 'page starts at 1').default(1),
});

export function parsePageQuery(params: URLSearchParams) {
  return pageQuerySchema.safeParse({ page: params.get('page') ?? undefined });
}
