import { z } from 'zod';
import { RANGE_QUANTITIES } from '@/lib/catalog/range-inputs';
import { analyzeRequestSchema, parseAnalyzeRequest, zodIssues } from '@/lib/validation/analyze';
import type { AnalyzeRequest, FieldIssue } from '@/lib/engine/types';

/**
 * Shape of an operating range (a revision's `range`, the corner and spread requests).
 * Structure only (400); min ≤ max, tolerances under 100 % and corners that no circuit can
 * be are the engine's (422, lib/engine/range.ts).
 */
const finite = (label: string) =>
  z.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be finite`);

const interval = (label: string, unit: string) =>
  z.object({ min: finite(`${label} minimum (${unit})`), max: finite(`${label} maximum (${unit})`) }, { error: `${label} needs { min, max } in ${unit}` });

const tolerance = (label: string) => z.object({ tol: finite(`${label} tolerance (a fraction, 0.2 = ±20 %)`) }, { error: `${label} needs { tol }` });

const q = RANGE_QUANTITIES;

export const rangeSchema = z.object({
  vin: interval(q.vin.label, q.vin.unit),
  iout: interval(q.iout.label, q.iout.unit),
  l: tolerance(q.l.label),
  c: tolerance(q.c.label),
  rc: interval(q.rc.label, q.rc.unit),
  parts: z
    .object({
      resistorTol: finite(`${q.resistorTol.label} tolerance (a fraction)`),
      capacitorTol: finite(`${q.capacitorTol.label} tolerance (a fraction)`),
    })
    .optional(),
});

export const targetsSchema = z.object({
  phaseMarginDeg: finite(`${q.phaseMarginDeg.label} (${q.phaseMarginDeg.unit})`),
  gainMarginDb: finite(`${q.gainMarginDb.label} (${q.gainMarginDb.unit})`),
});

/** The corner sweep's additions to the analysis body (range absent: the design's defaults). */
export const cornersExtraSchema = z.object({
  range: rangeSchema.optional(),
  targets: targetsSchema.optional(),
  /** Include each corner's loop gain on the sweep grid (for plotting). */
  loop: z.boolean().optional(),
});

/** The spread's additions; more than the sample limit is refused by the engine (422). */
export const spreadExtraSchema = z.object({
  range: rangeSchema.optional(),
  targets: targetsSchema.optional(),
  samples: z.number({ error: 'samples must be a number' }).int('samples must be a whole number').min(1, 'samples must be at least 1'),
  seed: z.number({ error: 'seed must be a number' }).int('seed must be a whole number').optional(),
  distribution: z.enum(['uniform', 'normal'], { error: 'distribution must be "uniform" or "normal"' }).default('uniform'),
});

/**
 * An analysis body plus extra fields: the analysis part parsed as POST /api/analyze parses it,
 * the rest by `extra`. Issues of both are reported together.
 */
export function parseWithAnalyze<S extends z.ZodType>(
  body: unknown,
  extra: S,
): { ok: true; request: AnalyzeRequest; extra: z.infer<S> } | { ok: false; issues: FieldIssue[] } {
  const a = parseAnalyzeRequest(body);
  const e = extra.safeParse(body);
  if (a.ok && e.success) return { ok: true, request: a.data, extra: e.data };
  return { ok: false, issues: [...(a.ok ? [] : a.issues), ...(e.success ? [] : zodIssues(e.error))] };
}

/** A revision's input: the analysis request plus its operating range and margin targets (both optional). */
export const designInputSchema = analyzeRequestSchema.extend({
  range: rangeSchema.optional(),
  targets: targetsSchema.optional(),
});
