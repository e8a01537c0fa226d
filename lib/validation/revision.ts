import { z } from 'zod';
import { designInputSchema } from './range';

export const revisionCreateSchema = z.object({
  baseRevision: z.number({ error: 'baseRevision must be a revision number or null' }).int().positive().nullable(),
  note: z.string({ error: 'note must be text' }).trim().max(2000, 'note must be at most 2000 characters').default(''),
  input: designInputSchema,
});

export type RevisionCreate = z.infer<typeof revisionCreateSchema>;

/** GET /api/designs/:id/revisions's `?page=N` (from 1; past the last page serves the last one). */
export const revisionListQuerySchema = z.object({
  page: z.coerce.number({ error: 'page must be a number' }).int('page must be a whole number').min(1, 'page starts at 1').default(1),
});

export function parseRevisionListQuery(params: URLSearchParams) {
  return revisionListQuerySchema.safeParse({ page: params.get('page') ?? undefined });
}
