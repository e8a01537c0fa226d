import { z } from 'zod';
import { PARTS } from '@/lib/catalog/compensators';
import { inputByPath, inputLabel } from '@/lib/catalog/stage-inputs';
import {
  AMPLIFIERS,
  COMPENSATOR_TYPES,
  E_SERIES_NAMES,
  MODULATOR_MODES,
  TOPOLOGIES,
  type AnalyzeRequest,
  type FieldIssue,
  type ModulatorInput,
} from '@/lib/engine/types';

/**
 * Shape of an analysis request (POST /api/analyze, a revision's input).
 * Only structure is checked here (answers 400); physical sense (L > 0,
 * buck vout < vin, …) is the engine's job and answers 422.
 *
 * Direction of the contract: the engine's `AnalyzeRequest` (lib/engine/types.ts)
 * is the source; this schema must parse to exactly that type (checked at the
 * bottom of this file at compile time), so a field added to the engine without
 * a schema entry, or the other way round, fails the type check.
 */
const finite = (label: string) =>
  z.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be finite`);

/** A stage input's number, its messages naming the field as the form does ("Inductance L (l) must be a number"). */
const stageNumber = (path: string) => {
  const spec = inputByPath(path);
  const field = path.split('.').at(-1) ?? path;
  return finite(spec ? `${inputLabel(spec)} (${field})` : field);
};

/** `"a", "b" or "c"` for messages naming a closed list. */
export function listWords(values: readonly string[]): string {
  const q = values.map((v) => `"${v}"`);
  return q.length <= 1 ? (q[0] ?? '') : `${q.slice(0, -1).join(', ')} or ${q.at(-1)}`;
}

const oneOf = <const T extends readonly [string, ...string[]]>(values: T, field: string) =>
  z.enum(values, { error: `${field} must be ${listWords(values)}` });

export const topologySchema = oneOf(TOPOLOGIES, 'topology');
export const compensatorTypeSchema = oneOf(COMPENSATOR_TYPES, 'type');
export const amplifierSchema = oneOf(AMPLIFIERS, 'amplifier');
export const modulatorModeSchema = oneOf(MODULATOR_MODES, 'mode');
export const eSeriesSchema = z.enum(E_SERIES_NAMES, { error: `series must be one of ${E_SERIES_NAMES.join(', ')}` });

export const converterSchema = z.object({
  topology: topologySchema,
  vin: stageNumber('converter.vin'),
  vout: stageNumber('converter.vout'),
  iout: stageNumber('converter.iout'),
  fsw: stageNumber('converter.fsw'),
  l: stageNumber('converter.l'),
  rl: stageNumber('converter.rl').default(0),
  c: stageNumber('converter.c'),
  rc: stageNumber('converter.rc').default(0),
  vd: stageNumber('converter.vd').default(0),
});

/**
 * A modulator without `mode` is voltage mode (designs saved before modes existed).
 * Voltage mode needs vramp; peak current mode needs ri (se defaults to 0).
 */
export const modulatorFieldsSchema = z.object({
  mode: modulatorModeSchema.optional(),
  vramp: stageNumber('modulator.vramp').optional(),
  ri: stageNumber('modulator.ri').optional(),
  se: stageNumber('modulator.se').optional(),
});
export const modulatorSchema = modulatorFieldsSchema
  .superRefine((m, ctx) => {
    if (m.mode === 'peak-current') {
      if (m.ri === undefined) ctx.addIssue({ code: 'custom', path: ['ri'], message: 'ri (current-sense gain, V/A) is required in peak current mode' });
    } else if (m.vramp === undefined) {
      ctx.addIssue({ code: 'custom', path: ['vramp'], message: 'vramp (PWM ramp, V) is required in voltage mode' });
    }
  })
  .transform((m): ModulatorInput => (m.mode === 'peak-current' ? { mode: m.mode, ri: m.ri ?? 0, se: m.se ?? 0 } : { ...(m.mode ? { mode: m.mode } : {}), vramp: m.vramp ?? 0 }));

export const feedbackSchema = z.object({ vref: stageNumber('feedback.vref') });

export const compensatorSchema = z.object({
  type: compensatorTypeSchema,
  amplifier: amplifierSchema.optional(),
  r1: finite(PARTS.r1.name),
  r2: finite(PARTS.r2.name).optional(),
  r3: finite(PARTS.r3.name).optional(),
  c1: finite(PARTS.c1.name),
  c2: finite(PARTS.c2.name).optional(),
  c3: finite(PARTS.c3.name).optional(),
  gm: finite('gm').optional(),
  ro: finite('ro').optional(),
  rb: finite(PARTS.rb.name).optional(),
  opamp: z.object({ a0: finite('a0'), gbw: finite('gbw') }).optional(),
});

export const partsOptionsSchema = z.object({
  resistorSeries: eSeriesSchema.default('E96'),
  capacitorSeries: eSeriesSchema.default('E12'),
});

export const sweepSchema = z
  .object({
    fStart: finite('fStart').refine((v) => v > 0, 'fStart must be above 0 Hz'),
    fStop: finite('fStop'),
    points: z.number().int('points must be a whole number').min(10).max(20000),
  })
  .refine((s) => s.fStop > s.fStart, { message: 'fStop must be above fStart', path: ['fStop'] });

/** A load or line step (the closed-loop view's; saved with a revision, ignored by the analysis). */
export const stepSchema = z.object({
  kind: z.enum(['load', 'line'], { error: 'kind must be "load" or "line"' }),
  from: finite('from'),
  to: finite('to'),
  slew: finite('slew').refine((v) => v > 0, 'slew must be above 0 (leave it out for an ideal step)').nullable().optional(),
  band: finite('band')
    .refine((v) => v > 0 && v < 0.5, 'band is relative to vout: above 0 and below 0.5 (0.01 = ±1 %)')
    .optional(),
});

export const analyzeRequestSchema = z.object({
  converter: converterSchema,
  modulator: modulatorSchema,
  feedback: feedbackSchema,
  compensator: compensatorSchema,
  parts: partsOptionsSchema.optional(),
  sweep: sweepSchema.optional(),
  step: stepSchema.optional(),
});

/**
 * What the answer to POST /api/analyze carries: `output: { arrays: false }` in the body or
 * `?arrays=0` in the URL leaves the Bode arrays out (margins, landmarks, parts and checks only).
 * Kept apart from the request schema so a revision's stored input never holds it.
 */
export const analyzeOutputSchema = z
  .object({ arrays: z.boolean({ error: 'output.arrays must be true or false' }).default(true) })
  .default({ arrays: true });

/** The body of POST /api/analyze: a request plus what the answer should carry. */
export const analyzeBodySchema = analyzeRequestSchema.extend({ output: analyzeOutputSchema });

/** `?arrays=0|1|true|false` overrides `output.arrays`; anything else is a field issue. */
export function arraysWanted(url: URL, fromBody: boolean): { ok: true; arrays: boolean } | { ok: false; issues: FieldIssue[] } {
  const q = url.searchParams.get('arrays');
  if (q === null) return { ok: true, arrays: fromBody };
  if (!['0', '1', 'true', 'false'].includes(q))
    return { ok: false, issues: [{ path: 'arrays', message: 'the arrays query parameter must be 0, 1, true or false' }] };
  return { ok: true, arrays: q === '1' || q === 'true' };
}

export type AnalyzeRequestInput = z.input<typeof analyzeRequestSchema>;

/** Parse into the engine's request type (defaults applied). */
export function parseAnalyzeRequest(body: unknown): { ok: true; data: AnalyzeRequest } | { ok: false; issues: FieldIssue[] } {
  const r = analyzeRequestSchema.safeParse(body);
  if (!r.success) return { ok: false, issues: zodIssues(r.error) };
  return { ok: true, data: r.data };
}

/** zod issues as the API's { path, message } list, path dotted. */
export function zodIssues(error: z.ZodError): FieldIssue[] {
  return error.issues.map((i) => ({
    path: i.path.map(String).join('.') || '(body)',
    message: i.message,
  }));
}

// Compile-time tie between the schema and the engine's request type: both
// directions must be assignable and the key sets equal at every level.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
type SameKeys<A, B> = Same<keyof A, keyof B>;
type Parsed = z.output<typeof analyzeRequestSchema>;
type Req = Required<AnalyzeRequest>;
type P = Required<Parsed>;
const contractChecks: [
  Same<Parsed, AnalyzeRequest>,
  SameKeys<Parsed, AnalyzeRequest>,
  SameKeys<P['converter'], Req['converter']>,
  SameKeys<P['modulator'], Req['modulator']>,
  SameKeys<P['feedback'], Req['feedback']>,
  SameKeys<P['compensator'], Req['compensator']>,
  SameKeys<P['parts'], Req['parts']>,
  SameKeys<P['sweep'], Req['sweep']>,
  SameKeys<P['step'], Req['step']>,
] = [true, true, true, true, true, true, true, true, true];
void contractChecks;
