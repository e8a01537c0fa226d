import { z } from 'zod';
import { PART_ORDER } from '@/lib/catalog/compensators';
import { topologySchema } from './analyze';

export { topologySchema };

export const designCreateSchema = z.object({
  name: z
    .string({ error: 'name is required' })
    .trim()
    .min(1, 'name must not be empty')
    .max(120, 'name must be at most 120 characters'),
  description: z.string().trim().max(2000, 'description must be at most 2000 characters').optional(),
  topology: topologySchema.default('buck'),
});

export const designUpdateSchema = designCreateSchema
  .omit({ topology: true })
  .partial()
  .extend({
    // partialRecord: a mapping may name only some parts (z.record with enum keys wants all).
    designatorMap: z
      .partialRecord(
        z.enum(PART_ORDER),
        z.string().trim().regex(/^[A-Za-z]{1,4}\d{1,5}[A-Za-z]?$/, 'use a reference designator such as R17 or C42'),
      )
      .optional(),
  });

export type DesignCreate = z.infer<typeof designCreateSchema>;
export type DesignUpdate = z.infer<typeof designUpdateSchema>;

import { DESIGN_ARCHIVED, DESIGN_SORTS, DESIGN_STATUSES, entriesOf, type DesignListParams } from '@/lib/designs-list-query';

export { DESIGN_ARCHIVED, DESIGN_PAGE_SIZE, DESIGN_SORTS, DESIGN_STATUSES, defaultSortDir, designListSearch, readDesignListQuery } from '@/lib/designs-list-query';
export type { DesignListQuery, DesignSort } from '@/lib/designs-list-query';

/**
 * GET /api/designs's parameters, strictly (400 naming the parameter); the page reads the same
 * parameters leniently with readDesignListQuery (lib/designs-list-query.ts, no zod on the client).
 */
export const designListQuerySchema = z.object({
  q: z.string().trim().max(200, 'q must be at most 200 characters').default(''),
  topology: z.enum(['all', 'buck', 'boost', 'buck-boost'], { error: 'topology must be all, buck, boost or buck-boost' }).default('all'),
  status: z.enum(['all', ...DESIGN_STATUSES], { error: `status must be all, ${DESIGN_STATUSES.join(', ')}` }).default('all'),
  sort: z.enum(DESIGN_SORTS, { error: `sort must be one of ${DESIGN_SORTS.join(', ')}` }).default('updatedAt'),
  dir: z.enum(['asc', 'desc'], { error: 'dir must be asc or desc' }).optional(),
  page: z.coerce.number({ error: 'page must be a number' }).int('page must be a whole number').min(1, 'page starts at 1').default(1),
  archived: z.enum(DESIGN_ARCHIVED, { error: 'archived must be "active", "archived" or "all"' }).default('active'),
  waiting: z.enum(['me'], { error: 'waiting must be "me"' }).optional(),
});

export function parseDesignListQuery(params: DesignListParams) {
  return designListQuerySchema.safeParse(entriesOf(params));
}
