import { z } from 'zod';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { DEFAULT_STEP_BAND, type StepDefinition } from '@/lib/engine/step-response';
import { parseAnalyzeRequest, stepSchema, zodIssues } from './analyze';

/**
 * Time-domain requests: the analysis body plus a step (POST /api/analyze/transient, the
 * switching check, a revision's stored step) or injection frequencies (the switching check).
 * Structure only (400); what no circuit can do answers 422 from the engine.
 */
const finite = (label: string) =>
  z.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be finite`);

export { stepSchema };

export const injectionSchema = z.object({
  frequencies: z
    .array(finite('frequency').refine((v) => v > 0, 'each frequency must be above 0 Hz'), { error: 'frequencies must be a list of Hz' })
    .min(1, 'give at least one frequency')
    .max(8, 'give at most 8 frequencies'),
});

export type StepInput = z.input<typeof stepSchema>;

type Parsed<T> = { ok: true; data: T } | { ok: false; issues: { path: string; message: string }[] };

const prefixed = (prefix: string, issues: { path: string; message: string }[]) =>
  issues.map((i) => ({ ...i, path: i.path === '(body)' ? prefix : `${prefix}.${i.path}` }));

const field = (body: unknown, key: string): unknown =>
  body && typeof body === 'object' && key in body ? Reflect.get(body, key) : undefined;

/** A step on its own (e.g. a revision's stored step). */
export function parseStep(raw: unknown): Parsed<StepDefinition> {
  const r = stepSchema.safeParse(raw);
  if (!r.success) return { ok: false, issues: prefixed('step', zodIssues(r.error)) };
  const { kind, from, to, slew, band } = r.data;
  return { ok: true, data: { kind, from, to, slew: slew ?? null, band: band ?? DEFAULT_STEP_BAND } };
}

/** The analysis body plus `step` (required). */
export function parseTransientRequest(body: unknown): Parsed<{ request: AnalyzeRequest; step: StepDefinition }> {
  const base = parseAnalyzeRequest(body);
  const raw = field(body, 'step');
  const step = raw === undefined ? { ok: false as const, issues: [{ path: 'step', message: 'step is required: { kind, from, to, slew?, band? }' }] } : parseStep(raw);
  if (!base.ok || !step.ok) return { ok: false, issues: [...(base.ok ? [] : base.issues), ...(step.ok ? [] : step.issues)] };
  return { ok: true, data: { request: base.data, step: step.data } };
}

export type SwitchingWork = { kind: 'step'; step: StepDefinition } | { kind: 'injection'; frequencies: number[] };

/** The analysis body plus exactly one of `step` or `injection`. */
export function parseSwitchingRequest(body: unknown): Parsed<{ request: AnalyzeRequest; work: SwitchingWork }> {
  const base = parseAnalyzeRequest(body);
  const rawStep = field(body, 'step');
  const rawInj = field(body, 'injection');
  const issues = base.ok ? [] : [...base.issues];
  let work: SwitchingWork | null = null;
  if ((rawStep === undefined) === (rawInj === undefined)) {
    issues.push({ path: 'step', message: 'give either step: { kind, from, to, … } or injection: { frequencies: [Hz, …] }, not both or neither' });
  } else if (rawStep !== undefined) {
    const s = parseStep(rawStep);
    if (s.ok) work = { kind: 'step', step: s.data };
    else issues.push(...s.issues);
  } else {
    const r = injectionSchema.safeParse(rawInj);
    if (r.success) work = { kind: 'injection', frequencies: r.data.frequencies };
    else issues.push(...prefixed('injection', zodIssues(r.error)));
  }
  if (!base.ok || work === null) return { ok: false, issues };
  return { ok: true, data: { request: base.data, work } };
}
