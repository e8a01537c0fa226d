import { z } from 'zod';
import { analyzeRequestSchema } from './analyze';
import { stepSchema } from './time-domain';

export const revisionCreateSchema = z.object({
  baseRevision: z.number({ error: 'baseRevision must be a revision number or null' }).int().positive().nullable(),
  note: z.string({ error: 'note must be text' }).trim().max(2000, 'note must be at most 2000 characters').default(''),
  // The step of the closed-loop view is kept with the input (optional: older revisions have none).
  input: analyzeRequestSchema.extend({ step: stepSchema.optional() }),
});

export type RevisionCreate = z.infer<typeof revisionCreateSchema>;
