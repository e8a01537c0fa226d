/**
 * Physical sense of an analysis request. The zod schema (lib/validation) checks structure
 * (HTTP 400); this module rejects what no circuit can be (HTTP 422) by throwing
 * EngineInputError with every problem found, each naming its field ("converter.l", …).
 */
import { AMPLIFIER_INPUTS, amplifierInputLabel, COMPENSATORS, PARTS } from '@/lib/catalog/compensators';
import { inputApplies, inputLabel, STAGE_INPUTS, type InputSpec } from '@/lib/catalog/stage-inputs';
import { EngineInputError, type AnalyzeRequest, type CompensatorInput, type FieldIssue } from './types';

const num = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * An input's name for a message. Labels are built only when a check fails: validation runs on
 * every analysis (the drag path included), and valid input is the usual case.
 */
type Name = string | (() => string);
const named = (what: Name) => (typeof what === 'string' ? what : what());

const requirePositive = (issues: FieldIssue[], path: string, v: unknown, what: Name) => {
  if (!num(v)) issues.push({ path, message: `${named(what)} is required and must be a finite number` });
  else if (v <= 0) issues.push({ path, message: `${named(what)} must be above 0` });
};

const requireNonNegative = (issues: FieldIssue[], path: string, v: unknown, what: Name) => {
  if (!num(v)) issues.push({ path, message: `${named(what)} must be a finite number` });
  else if (v < 0) issues.push({ path, message: `${named(what)} cannot be negative` });
};

/** One number checked against its catalogue bound, named by the catalogue's label. */
const requireBound = (issues: FieldIssue[], path: string, v: unknown, bound: 'positive' | 'nonNegative', what: Name) =>
  (bound === 'positive' ? requirePositive : requireNonNegative)(issues, path, v, what);

/**
 * A stage input checked against its catalogue bound. Valid input is the usual case: the value
 * is tested first, and the path and label closures are made only for a failing one.
 */
const requireSpec = (issues: FieldIssue[], spec: InputSpec, v: unknown) => {
  if (num(v) && (spec.bound === 'positive' ? v > 0 : v >= 0)) return;
  requireBound(issues, `${spec.section}.${spec.field}`, v, spec.bound, () => inputLabel(spec));
};

/** "R2 (a Type II part)" — the part's schematic name from the catalogue. */
const partLabel = (key: keyof typeof PARTS, note?: string) =>
  `${PARTS[key].name}${note ? ` (${note})` : ''}`;

/**
 * Problems of a compensator's parts, for the parts its catalogue entry lists: each above 0,
 * except C2, which may be 0 or left out (no high-frequency pole).
 */
export const compensatorIssues = (c: CompensatorInput, prefix = 'compensator'): FieldIssue[] => {
  const issues: FieldIssue[] = [];
  const entry = Object.hasOwn(COMPENSATORS, c.type) ? COMPENSATORS[c.type] : null;
  if (!entry) {
    issues.push({ path: `${prefix}.type`, message: `type must be one of ${Object.values(COMPENSATORS).map((e) => e.label).join(', ')}` });
    return issues;
  }
  for (const key of entry.parts) {
    const v: unknown = c[key];
    // Valid parts (the usual case) make no path or label.
    if (key === 'c2') {
      if (v !== undefined && !(num(v) && v >= 0)) requireNonNegative(issues, `${prefix}.c2`, v, () => partLabel('c2', '0 = absent'));
    } else if (!(num(v) && v > 0)) {
      requirePositive(issues, `${prefix}.${key}`, v, () => partLabel(key, key === 'r1' || key === 'c1' ? undefined : `a ${entry.label} part`));
    }
  }
  if (c.amplifier !== undefined && c.amplifier !== 'opamp' && c.amplifier !== 'transconductance') {
    issues.push({ path: `${prefix}.amplifier`, message: 'amplifier must be "opamp" or "transconductance"' });
  }
  if (c.amplifier === 'transconductance') {
    if (c.type === 'type1') {
      issues.push({ path: `${prefix}.amplifier`, message: `a transconductance amplifier is modelled for ${COMPENSATORS.type2.label} and ${COMPENSATORS.type3.label}; choose one of them or the op-amp` });
    }
    requirePositive(issues, `${prefix}.gm`, c.gm, () => `${amplifierInputLabel('gm')} (${AMPLIFIER_INPUTS.gm.unit})`);
    requirePositive(issues, `${prefix}.rb`, c.rb, () => partLabel('rb', `${PARTS.rb.role}; part of the loop with a transconductance amplifier`));
    if (c.ro !== undefined) requirePositive(issues, `${prefix}.ro`, c.ro, () => `${amplifierInputLabel('ro')} (omit for ${AMPLIFIER_INPUTS.ro.absentMeans})`);
    if (c.opamp !== undefined) issues.push({ path: `${prefix}.opamp`, message: 'an op-amp model does not apply to a transconductance amplifier; remove it' });
  }
  if (c.opamp !== undefined && c.amplifier !== 'transconductance') {
    requirePositive(issues, `${prefix}.opamp.a0`, c.opamp?.a0, () => `${amplifierInputLabel('a0')} (${AMPLIFIER_INPUTS.a0.unit})`);
    requirePositive(issues, `${prefix}.opamp.gbw`, c.opamp?.gbw, () => `${amplifierInputLabel('gbw')} (${AMPLIFIER_INPUTS.gbw.unit})`);
  }
  return issues;
};

/**
 * A stage input as the request holds it: undefined when left out, except the converter's loss
 * terms, which the engine takes as their catalogue default (0) when absent (withLossDefaults).
 */
const stageValue = (req: StageRequest, spec: InputSpec): unknown => {
  const section: unknown = req[spec.section];
  const v: unknown = section && typeof section === 'object' ? Reflect.get(section, spec.field) : undefined;
  return v === undefined && spec.section === 'converter' ? spec.defaultValue : v;
};

type StageRequest = Pick<AnalyzeRequest, 'converter' | 'modulator' | 'sweep'> & { feedback?: AnalyzeRequest['feedback'] };

/**
 * Everything about the power stage, modulator, reference and sweep that no circuit can be.
 * Each input's bound and name come from the catalogue (lib/catalog/stage-inputs.ts).
 * Duty-cycle limits that need the loss model (e.g. a boost whose rl caps the ratio) are
 * reported by steady-state.ts with the same error type.
 */
export const stageIssues = (req: StageRequest): FieldIssue[] => {
  const issues: FieldIssue[] = [];
  const c = req.converter;
  const mode = req.modulator?.mode;
  const knownMode = mode === undefined || mode === 'voltage' || mode === 'peak-current';
  for (const spec of STAGE_INPUTS) {
    if (spec.section === 'feedback' && !req.feedback) continue;
    if (spec.section === 'modulator' && (!knownMode || !inputApplies(spec, { modulator: { mode } }))) continue;
    requireSpec(issues, spec, stageValue(req, spec));
  }
  if (!knownMode) issues.push({ path: 'modulator.mode', message: 'mode must be "voltage" or "peak-current"' });
  if (num(c.vin) && num(c.vout) && c.vin > 0 && c.vout > 0) {
    if (c.topology === 'buck' && c.vout >= c.vin) {
      issues.push({ path: 'converter.vout', message: `a buck steps down: vout (${c.vout} V) must be below vin (${c.vin} V)` });
    }
    if (c.topology === 'boost' && c.vout <= c.vin) {
      issues.push({ path: 'converter.vout', message: `a boost steps up: vout (${c.vout} V) must be above vin (${c.vin} V)` });
    }
  }
  if (req.feedback) {
    if (num(req.feedback.vref) && num(c.vout) && req.feedback.vref >= Math.abs(c.vout) && req.feedback.vref > 0) {
      issues.push({ path: 'feedback.vref', message: `vref (${req.feedback.vref} V) must be below |vout| (${Math.abs(c.vout)} V) for a divider to set the output` });
    }
  }
  const s = req.sweep;
  if (s) {
    requirePositive(issues, 'sweep.fStart', s.fStart, 'Sweep start');
    if (!num(s.fStop) || !(s.fStop > s.fStart)) issues.push({ path: 'sweep.fStop', message: 'sweep stop must be above the start frequency' });
    if (!Number.isInteger(s.points) || s.points < 2) issues.push({ path: 'sweep.points', message: 'sweep needs at least 2 points' });
  }
  return issues;
};

/** Throw EngineInputError listing every physical problem of a full request. */
export const validateRequest = (req: AnalyzeRequest): void => {
  const issues = [...stageIssues(req), ...compensatorIssues(req.compensator)];
  if (issues.length > 0) throw new EngineInputError(issues);
};
