import { z } from 'zod';
import { COMPENSATOR_TYPES, E_SERIES_NAMES, TOPOLOGIES } from '@/lib/engine/types';
import type { AnalyzeRequest } from '@/lib/engine/types';

/**
 * Shape of an analysis request (POST /api/analyze, a revision's input).
 * Only structure is checked here (answers 400); physical sense (L > 0,
 * buck vout < vin, …) is the engine's job and answers 422.
 */
const finite = (label: string) =>
  z.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be finite`);

export const converterSchema = z.object({
  topology: z.enum(TOPOLOGIES as [string, ...string[]], {
    error: 'topology must be "buck", "boost" or "buck-boost"',
  }),
  vin: finite('vin'),
  vout: finite('vout'),
  iout: finite('iout'),
  fsw: finite('fsw'),
  l: finite('l'),
  rl: finite('rl').default(0),
  c: finite('c'),
  rc: finite('rc').default(0),
  vd: finite('vd').default(0),
});

export const compensatorSchema = z.object({
  type: z.enum(COMPENSATOR_TYPES as [string, ...string[]], {
    error: 'type must be "type1", "type2" or "type3"',
  }),
  r1: finite('r1'),
  r2: finite('r2').optional(),
  r3: finite('r3').optional(),
  c1: finite('c1'),
  c2: finite('c2').optional(),
  c3: finite('c3').optional(),
});

const seriesSchema = z.enum(E_SERIES_NAMES as [string, ...string[]], {
  error: 'series must be one of E6, E12, E24, E48, E96, E192',
});

export const analyzeRequestSchema = z.object({
  converter: converterSchema,
  modulator: z.object({ vramp: finite('vramp') }),
  feedback: z.object({ vref: finite('vref') }),
  compensator: compensatorSchema,
  parts: z
    .object({ resistorSeries: seriesSchema.default('E96'), capacitorSeries: seriesSchema.default('E12') })
    .optional(),
  sweep: z
    .object({
      fStart: finite('fStart').refine((v) => v > 0, 'fStart must be above 0 Hz'),
      fStop: finite('fStop'),
      points: z.number().int('points must be a whole number').min(10).max(20000),
    })
    .refine((s) => s.fStop > s.fStart, { message: 'fStop must be above fStart', path: ['fStop'] })
    .optional(),
});

/**
 * What the answer to POST /api/analyze carries: `output: { arrays: false }` in the body or
 * `?arrays=0` in the URL leaves the Bode arrays out (margins, landmarks, parts and checks only).
 * Kept apart from the request schema so a revision's stored input never holds it.
 */
export const analyzeOutputSchema = z
  .object({ arrays: z.boolean({ error: 'output.arrays must be true or false' }).default(true) })
  .default({ arrays: true });

export function parseAnalyzeOutput(body: unknown, url: URL) {
  const raw = body && typeof body === 'object' && 'output' in body ? body.output : undefined;
  const r = analyzeOutputSchema.safeParse(raw);
  if (!r.success) return { ok: false as const, issues: zodIssues(r.error).map((i) => ({ ...i, path: i.path === '(body)' ? 'output' : `output.${i.path}` })) };
  const q = url.searchParams.get('arrays');
  if (q !== null && !['0', '1', 'true', 'false'].includes(q))
    return { ok: false as const, issues: [{ path: 'arrays', message: 'the arrays query parameter must be 0, 1, true or false' }] };
  const arrays = q === null ? r.data.arrays : q === '1' || q === 'true';
  return { ok: true as const, data: { arrays } };
}

export type AnalyzeRequestInput = z.input<typeof analyzeRequestSchema>;

/** Parse into the engine's request type (defaults applied). */
export function parseAnalyzeRequest(body: unknown) {
  const r = analyzeRequestSchema.safeParse(body);
  if (!r.success) return { ok: false as const, issues: zodIssues(r.error) };
  return { ok: true as const, data: r.data as unknown as AnalyzeRequest };
}

/** zod issues as the API's { path, message } list, path dotted. */
export function zodIssues(error: z.ZodError) {
  return error.issues.map((i) => ({
    path: i.path.map(String).join('.') || '(body)',
    message: i.message,
  }));
}
