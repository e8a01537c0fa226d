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

/** Query of GET /api/designs: ?archived=active|archived|all (default active), ?waiting=me. */
export const designListQuerySchema = z.object({
  archived: z.enum(['active', 'archived', 'all'], { error: 'archived must be "active", "archived" or "all"' }).default('active'),
  waiting: z.enum(['me'], { error: 'waiting must be "me"' }).optional(),
});

export type DesignListQuery = z.infer<typeof designListQuerySchema>;
