/**
 * Load-step and line-step response of the averaged small-signal loop (linear-loop.ts), with
 * the checks for what that model cannot show: a duty cycle that would leave 0…100 %, a load
 * or line that puts the stage in DCM, an output excursion too large for a small-signal reading.
 *
 * The model is linearised at the state before the step (load `from`, or vin `from`): the step
 * is a current drawn from the output node (load) or a change of vin (line), as in the
 * switching simulation, so the two can be overlaid.
 */
import { marginsForCompensator, preparePlant, type PreparedPlant } from './analyze';
import { loopBlocks } from './closed-loop';
import { simulateLoopStep, stepMetrics } from './linear-loop';
import { computeDuty, computeOperatingPoint, withLossDefaults } from './steady-state';
import { EngineInputError, type AnalyzeRequest, type ConverterInput, type FieldIssue, type ModulatorInput } from './types';

export type StepKind = 'load' | 'line';

export interface StepDefinition {
  kind: StepKind;
  /** Load current (A) or input voltage (V) before the step. */
  from: number;
  /** … and after it. */
  to: number;
  /** A/s or V/s; absent or null = ideal step. */
  slew?: number | null;
  /** Settling band relative to vout (0.01 = ±1 %). */
  band?: number;
}

export const DEFAULT_STEP_BAND = 0.01;

export interface StepResponseResult {
  kind: StepKind;
  /** Time, s; the step starts at 0 (one sample before it shows the steady state). */
  t: number[];
  /** Output voltage (magnitude for the inverting buck-boost), V. */
  vout: number[];
  /** Duty cycle of the averaged model (voltage mode), 0…1; null when the mode has no duty read-out. */
  duty: number[] | null;
  /** Largest deviation from vout, signed, V. */
  peakDeviation: number;
  /** Rebound past the final value opposite to the first deviation, V (≥ 0). */
  overshoot: number;
  /** Time after the step to stay within ±band·vout of the final value, s; null if not settled in the window. */
  settlingTime: number | null;
  /** Final value of the output, V. */
  finalVout: number;
  band: number;
  /** Why the small-signal result cannot be taken at face value; empty when the step is inside the model. */
  outsideModel: string[];
}

/** Samples after the step; enough to draw the curve and to read settling to 1/1000 of the window. */
const STEP_POINTS = 1200;
/** Output excursion above which a small-signal reading is doubtful (common practice). */
const SMALL_SIGNAL_LIMIT = 0.1;

const stepIssues = (step: StepDefinition): FieldIssue[] => {
  const issues: FieldIssue[] = [];
  const finite = (v: unknown) => typeof v === 'number' && Number.isFinite(v);
  const unit = step.kind === 'load' ? 'A' : 'V';
  if (!finite(step.from)) issues.push({ path: 'step.from', message: 'the value before the step must be a number' });
  if (!finite(step.to)) issues.push({ path: 'step.to', message: 'the value after the step must be a number' });
  if (step.kind === 'load' && finite(step.from) && step.from <= 0)
    issues.push({ path: 'step.from', message: `the load before the step must be above 0 ${unit} (the model is linearised there)` });
  if (step.kind === 'load' && finite(step.to) && step.to < 0) issues.push({ path: 'step.to', message: 'the load after the step cannot be negative' });
  if (step.kind === 'line' && finite(step.from) && step.from <= 0) issues.push({ path: 'step.from', message: 'vin before the step must be above 0 V' });
  if (step.kind === 'line' && finite(step.to) && step.to <= 0) issues.push({ path: 'step.to', message: 'vin after the step must be above 0 V' });
  if (finite(step.from) && step.from === step.to) issues.push({ path: 'step.to', message: `the step needs a change: to equals from (${step.from} ${unit})` });
  if (step.slew !== undefined && step.slew !== null && !(step.slew > 0)) issues.push({ path: 'step.slew', message: `the slew must be above 0 ${unit}/s (leave it out for an ideal step)` });
  if (step.band !== undefined && !(step.band > 0 && step.band < 0.5)) issues.push({ path: 'step.band', message: 'the settling band must be between 0 and 0.5 (0.01 = ±1 %)' });
  return issues;
};

/** The stage as it runs before the step. */
export const stageBeforeStep = (converter: ConverterInput, step: StepDefinition): ConverterInput =>
  step.kind === 'load' ? { ...converter, iout: step.from } : { ...converter, vin: step.from };

/** Voltage-mode PWM unless the modulator names another mode. */
export const isVoltageMode = (modulator: ModulatorInput): boolean => {
  const mode: unknown = Reflect.get(modulator, 'mode');
  return mode === undefined || mode === 'voltage';
};

const pct = (x: number) => `${(x * 100).toFixed(1)} %`;

/** Reasons the stage after the step is outside the CCM averaged model. */
const endStateReasons = (before: ConverterInput, step: StepDefinition): string[] => {
  const after = step.kind === 'load' ? { ...before, iout: step.to } : { ...before, vin: step.to };
  const reasons: string[] = [];
  if (step.kind === 'load' && step.to === 0) {
    reasons.push('at no load the stage leaves CCM (DCM or pulse skipping); the averaged CCM model does not hold after the step');
    return reasons;
  }
  try {
    computeDuty(after);
    const op = computeOperatingPoint(after);
    if (op.conduction === 'DCM') {
      reasons.push(
        step.kind === 'load'
          ? `at ${step.to} A the stage is in DCM (the boundary is ${op.criticalLoadCurrent.toPrecision(3)} A with a diode; a synchronous stage in forced PWM stays in CCM): the averaged CCM model does not hold after the step`
          : `at vin ${step.to} V the stage is in DCM: the averaged CCM model does not hold after the step`,
      );
    }
  } catch (err) {
    if (err instanceof EngineInputError) reasons.push(`after the step the stage cannot regulate: ${err.issues.map((i) => i.message).join('; ')}`);
    else throw err;
  }
  return reasons;
};

/**
 * Step response of the averaged loop. @throws EngineInputError (422) for an impossible
 * stage, compensator or step, each naming its field.
 */
export const simulateStepResponse = (request: AnalyzeRequest, step: StepDefinition, preparedBefore?: PreparedPlant): StepResponseResult => {
  const issues = stepIssues(step);
  if (issues.length > 0) throw new EngineInputError(issues);
  const converter = stageBeforeStep(withLossDefaults(request.converter), step);
  const prepared = preparedBefore ?? preparePlant({ ...request, converter });
  const band = step.band ?? DEFAULT_STEP_BAND;
  const margins = marginsForCompensator(prepared, request.compensator);
  const fsw = converter.fsw;
  const fc = margins.crossoverHz ?? fsw / 20;
  const slew = step.slew ?? null;
  const amplitude = step.to - step.from;
  const rampS = slew ? Math.abs(amplitude) / slew : 0;
  const blocks = loopBlocks(prepared, request.compensator);
  const bandV = band * converter.vout;
  // Window: the ramp plus 15 periods of fc; longer while the response has not settled.
  let durationS = rampS + 15 / fc;
  let sim = simulateLoopStep(blocks, { input: step.kind, amplitude, slewPerS: slew, durationS, points: STEP_POINTS });
  let metrics = stepMetrics(sim.t, sim.v, sim.vFinal, bandV);
  for (let k = 0; k < 3 && (metrics.settlingTime === null || metrics.settlingTime > 0.7 * durationS); k++) {
    durationS *= 3;
    sim = simulateLoopStep(blocks, { input: step.kind, amplitude, slewPerS: slew, durationS, points: STEP_POINTS });
    metrics = stepMetrics(sim.t, sim.v, sim.vFinal, bandV);
  }
  const outsideModel: string[] = [];
  const d0 = prepared.operatingPoint.duty;
  let duty: number[] | null = null;
  if (isVoltageMode(request.modulator)) {
    duty = sim.vc.map((vc) => d0 + vc / prepared.vramp);
    const hi = Math.max(...duty);
    const lo = Math.min(...duty);
    if (hi >= 1) outsideModel.push(`the duty cycle would reach ${pct(hi)}; it saturates at 100 %, so the real deviation is larger and the recovery slower than shown`);
    if (lo <= 0) outsideModel.push(`the duty cycle would fall to ${pct(lo)}; it stops at 0 %, so the real deviation is larger and the recovery slower than shown`);
  }
  outsideModel.push(...endStateReasons(converter, step));
  if (Math.abs(metrics.peakDeviation) > SMALL_SIGNAL_LIMIT * converter.vout) {
    outsideModel.push(`the output moves by ${pct(Math.abs(metrics.peakDeviation) / converter.vout)} of vout; beyond about 10 % a small-signal result is only indicative (common practice)`);
  }
  const pre = -0.05 * durationS;
  const v0 = converter.vout;
  return {
    kind: step.kind,
    t: [pre, 0, ...sim.t],
    vout: [v0, v0, ...sim.v.map((v) => v0 + v)],
    duty: duty ? [d0, d0, ...duty] : null,
    peakDeviation: metrics.peakDeviation,
    overshoot: metrics.overshoot,
    settlingTime: metrics.settlingTime,
    finalVout: v0 + sim.vFinal,
    band,
    outsideModel,
  };
};
