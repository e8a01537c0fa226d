import { z } from 'zod';
import { designInputSchema } from './range';
import { designCreateSchema, designUpdateSchema } from './design';

/**
 * The design file (`format: "phasewright-design"`), as POST /api/designs/import takes it.
 * Only `format`, `version`, `design` and `input` are read; the rest is for people and for
 * checking that the import reproduces the exported results.
 */
export const DESIGN_FILE_FORMAT = 'phasewright-design';
export const DESIGN_FILE_VERSION = 1;

export const designFileSchema = z.object({
  format: z.literal(DESIGN_FILE_FORMAT, { error: `format must be "${DESIGN_FILE_FORMAT}"; this is not a Phasewright design file` }),
  version: z
    .number({ error: 'version must be a number' })
    .int()
    .min(1)
    .max(DESIGN_FILE_VERSION, `this file is of version above ${DESIGN_FILE_VERSION}; it was written by a newer Phasewright`),
  design: designCreateSchema.extend({
    designatorMap: designUpdateSchema.shape.designatorMap.default({}),
  }),
  revision: z
    .object({ number: z.number().int().positive().optional(), note: z.string().max(2000).optional() })
    .partial()
    .optional(),
  input: designInputSchema,
  results: z
    .object({
      crossoverHz: z.number().nullable(),
      phaseMarginDeg: z.number().nullable(),
      gainMarginDb: z.number().nullable(),
    })
    .partial()
    .optional(),
});

export type DesignFileInput = z.infer<typeof designFileSchema>;
