import { z } from 'zod';
import { designInputSchema } from './range';

export const revisionCreateSchema = z.object({
  baseRevision: z.number({ error: 'baseRevision must be a revision number or null' }).int().positive().nullable(),
  note: z.string({ error: 'note must be text' }).trim().max(2000, 'note must be at most 2000 characters').default(''),
  input: designInputSchema,
});

export type RevisionCreate = z.infer<typeof revisionCreateSchema>;

