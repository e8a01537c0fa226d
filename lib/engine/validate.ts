/**
 * Physical sense of an analysis request. The zod schema (lib/validation) checks structure
 * (HTTP 400); this module rejects what no circuit can be (HTTP 422) by throwing
 * EngineInputError with every problem found, each naming its field ("converter.l", …).
 */
import { EngineInputError, type AnalyzeRequest, type CompensatorInput, type FieldIssue } from './types';

const num = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

const requirePositive = (issues: FieldIssue[], path: string, v: unknown, what: string) => {
  if (!num(v)) issues.push({ path, message: `${what} is required and must be a finite number` });
  else if (v <= 0) issues.push({ path, message: `${what} must be above 0` });
};

const requireNonNegative = (issues: FieldIssue[], path: string, v: unknown, what: string) => {
  if (!num(v)) issues.push({ path, message: `${what} must be a finite number` });
  else if (v < 0) issues.push({ path, message: `${what} cannot be negative` });
};

/** Problems of a compensator's parts: R1, C1 > 0; Type II needs R2; Type III R2, R3, C3; C2 ≥ 0. */
export const compensatorIssues = (c: CompensatorInput, prefix = 'compensator'): FieldIssue[] => {
  const issues: FieldIssue[] = [];
  requirePositive(issues, `${prefix}.r1`, c.r1, 'R1');
  requirePositive(issues, `${prefix}.c1`, c.c1, 'C1');
  if (c.type === 'type2' || c.type === 'type3') {
    requirePositive(issues, `${prefix}.r2`, c.r2, `R2 (a ${c.type === 'type2' ? 'Type II' : 'Type III'} part)`);
    if (c.c2 !== undefined) requireNonNegative(issues, `${prefix}.c2`, c.c2, 'C2 (0 = absent)');
  }
  if (c.type === 'type3') {
    requirePositive(issues, `${prefix}.r3`, c.r3, 'R3 (a Type III part)');
    requirePositive(issues, `${prefix}.c3`, c.c3, 'C3 (a Type III part)');
  }
  if (c.amplifier !== undefined && c.amplifier !== 'opamp' && c.amplifier !== 'transconductance') {
    issues.push({ path: `${prefix}.amplifier`, message: 'amplifier must be "opamp" or "transconductance"' });
  }
  if (c.amplifier === 'transconductance') {
    if (c.type === 'type1') {
      issues.push({ path: `${prefix}.amplifier`, message: 'a transconductance amplifier is modelled for Type II and Type III; choose one of them or the op-amp' });
    }
    requirePositive(issues, `${prefix}.gm`, c.gm, 'Transconductance gm (S)');
    requirePositive(issues, `${prefix}.rb`, c.rb, 'Divider bottom Rb (part of the loop with a transconductance amplifier)');
    if (c.ro !== undefined) requirePositive(issues, `${prefix}.ro`, c.ro, 'Amplifier output resistance ro (omit for infinite)');
    if (c.opamp !== undefined) issues.push({ path: `${prefix}.opamp`, message: 'an op-amp model does not apply to a transconductance amplifier; remove it' });
  }
  if (c.opamp !== undefined && c.amplifier !== 'transconductance') {
    requirePositive(issues, `${prefix}.opamp.a0`, c.opamp?.a0, 'Op-amp open-loop gain a0 (V/V)');
    requirePositive(issues, `${prefix}.opamp.gbw`, c.opamp?.gbw, 'Op-amp gain-bandwidth GBW (Hz)');
  }
  return issues;
};

/**
 * Everything about the power stage, modulator, reference and sweep that no circuit can be.
 * Duty-cycle limits that need the loss model (e.g. a boost whose rl caps the ratio) are
 * reported by steady-state.ts with the same error type.
 */
export const stageIssues = (req: Pick<AnalyzeRequest, 'converter' | 'modulator' | 'sweep'> & { feedback?: AnalyzeRequest['feedback'] }): FieldIssue[] => {
  const issues: FieldIssue[] = [];
  const c = req.converter;
  requirePositive(issues, 'converter.vin', c.vin, 'Input voltage vin');
  requirePositive(issues, 'converter.vout', c.vout, 'Output voltage vout (a magnitude)');
  requirePositive(issues, 'converter.iout', c.iout, 'Load current iout');
  requirePositive(issues, 'converter.fsw', c.fsw, 'Switching frequency fsw');
  requirePositive(issues, 'converter.l', c.l, 'Inductance L');
  requirePositive(issues, 'converter.c', c.c, 'Output capacitance C');
  requireNonNegative(issues, 'converter.rl', c.rl ?? 0, 'Inductor DCR rl');
  requireNonNegative(issues, 'converter.rc', c.rc ?? 0, 'Capacitor ESR rc');
  requireNonNegative(issues, 'converter.vd', c.vd ?? 0, 'Diode drop vd');
  const m = req.modulator;
  if (m?.mode === 'peak-current') {
    requirePositive(issues, 'modulator.ri', m.ri, 'Current-sense gain Ri (V/A)');
    requireNonNegative(issues, 'modulator.se', m.se, 'External ramp Se (V/s, 0 = none)');
  } else if (m?.mode !== undefined && m?.mode !== 'voltage') {
    issues.push({ path: 'modulator.mode', message: 'mode must be "voltage" or "peak-current"' });
  } else {
    requirePositive(issues, 'modulator.vramp', m?.vramp, 'PWM ramp Vramp');
  }
  if (num(c.vin) && num(c.vout) && c.vin > 0 && c.vout > 0) {
    if (c.topology === 'buck' && c.vout >= c.vin) {
      issues.push({ path: 'converter.vout', message: `a buck steps down: vout (${c.vout} V) must be below vin (${c.vin} V)` });
    }
    if (c.topology === 'boost' && c.vout <= c.vin) {
      issues.push({ path: 'converter.vout', message: `a boost steps up: vout (${c.vout} V) must be above vin (${c.vin} V)` });
    }
  }
  if (req.feedback) {
    requirePositive(issues, 'feedback.vref', req.feedback.vref, 'Reference voltage vref');
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
