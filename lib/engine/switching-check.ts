/**
 * The switching check: the design simulated cycle by cycle (switching.ts) to show what the
 * averaged model leaves out.
 *
 * - switchingStep: the load or line step of step-response.ts simulated cycle by cycle,
 *   ripple included, next to the averaged prediction.
 * - modelCheck: small sinusoids injected in series with the sensed output at a few
 *   frequencies; the loop gain is read from the waveforms the way a network analyzer does:
 *   single-frequency DFTs of the signals on both sides of the injection over whole periods
 *   after settling, T = −V_y/V_x with V_x = V_y + V_inj (Middlebrook's injection, the
 *   method of the bench; sign as in T = Gc·P). Frequencies are moved to fsw/N (N whole) so
 *   the record spans whole periods of both the injection and the switching.
 *
 * Work is bounded: estimateCycles() gives the cycles a request needs, MAX_SWITCHING_CYCLES
 * caps it (the API answers 422 above it).
 */
import { evaluateLoopGain, marginsForCompensator, preparePlant, type PreparedPlant } from './analyze';
import { complexAt, loopBlocks } from './closed-loop';
import { simulateStepResponse, stageBeforeStep, type StepDefinition, type StepResponseResult } from './step-response';
import { createSwitchingSim, type CycleRecord, type Sample, type SwitchControl, type SwitchingSim } from './switching';
import { withLossDefaults } from './steady-state';
import { wrapDeg } from './transfer';
import { EngineInputError, type AnalyzeRequest, type ConverterInput } from './types';
import { inputByPath, inputLabel } from '@/lib/catalog/stage-inputs';

/** Most switching cycles one request may simulate (a second or two of work on one core). */
export const MAX_SWITCHING_CYCLES = 10_000;
/** Fewest and most injection frequencies per check. */
export const MAX_INJECTIONS = 8;
/** Samples per switching period. */
const SUBSTEPS = 20;

export type ProgressFn = (fraction: number, message: string) => void;

export interface SteadyStateSummary {
  /** Averages and peak-to-peak ripples over whole periods, V and A. */
  voutAvg: number;
  voutRipplePp: number;
  inductorAvg: number;
  inductorRipplePp: number;
  duty: number;
  /** Any cycle with a DCM interval / a duty at a limit. */
  dcm: boolean;
  saturated: boolean;
}

export interface Waveform {
  t: number[];
  vout: number[];
  iL: number[];
}

/** The switch control the modulator asks for. @throws EngineInputError when current-mode parameters are missing. */
export const switchControlOf = (request: AnalyzeRequest): SwitchControl => {
  const m = request.modulator;
  if (m.mode === 'peak-current') {
    const ri: unknown = m.ri;
    const se: unknown = m.se;
    const name = (path: string) => {
      const spec = inputByPath(path);
      return spec ? `${inputLabel(spec)} (${spec.unit})` : path;
    };
    if (typeof ri !== 'number' || !(ri > 0)) throw new EngineInputError([{ path: 'modulator.ri', message: `${name('modulator.ri')} must be above 0` }]);
    if (typeof se !== 'number' || !(se >= 0)) throw new EngineInputError([{ path: 'modulator.se', message: `${name('modulator.se')} must be 0 or more` }]);
    return { mode: 'peak-current', ri, se };
  }
  return { mode: 'voltage', vramp: m.vramp };
};

const initialVc = (control: SwitchControl, prepared: PreparedPlant): number => {
  const op = prepared.operatingPoint;
  if (control.mode === 'voltage') return op.duty * control.vramp;
  if (control.mode === 'peak-current') return control.ri * op.inductorPeak + (control.se * op.duty) / prepared.converter.fsw;
  return 0;
};

/** A simulation started at the averaged operating point of `prepared`. */
export const simulatorFor = (request: AnalyzeRequest, prepared: PreparedPlant, control: SwitchControl = switchControlOf(request)): SwitchingSim => {
  const op = prepared.operatingPoint;
  return createSwitchingSim({
    converter: prepared.converter,
    loadResistance: op.loadResistance,
    compensator: loopBlocks(prepared, request.compensator).compensator,
    control,
    vTarget: prepared.converter.vout,
    initial: { iL: op.inductorCurrent - op.inductorRipplePp / 2, vC: prepared.converter.vout, vc: initialVc(control, prepared) },
    substeps: SUBSTEPS,
  });
};

/** Cycles to let the loop settle: ten periods of the crossover frequency, within 100…3000. */
const settleCycles = (prepared: PreparedPlant, request: AnalyzeRequest): number => {
  const fc = marginsForCompensator(prepared, request.compensator).crossoverHz ?? prepared.converter.fsw / 20;
  return Math.min(3000, Math.max(100, Math.ceil((10 * prepared.converter.fsw) / fc)));
};

/** Run `cycles` cycles and summarise them (whole periods, so averages are exact sample means). */
export const measureSteadyState = (sim: SwitchingSim, cycles: number, keepWaveform = 0): { summary: SteadyStateSummary; waveform: Waveform } => {
  const waveform: Waveform = { t: [], vout: [], iL: [] };
  let n = 0;
  let vSum = 0;
  let iSum = 0;
  let vMin = Infinity;
  let vMax = -Infinity;
  let iMin = Infinity;
  let iMax = -Infinity;
  let dSum = 0;
  let count = 0;
  let dcm = false;
  let saturated = false;
  const keepFrom = (cycles - keepWaveform) * sim.substeps;
  sim.runCycles(
    cycles,
    (s: Sample) => {
      vSum += s.v;
      iSum += s.iL;
      if (s.v < vMin) vMin = s.v;
      if (s.v > vMax) vMax = s.v;
      if (s.iL < iMin) iMin = s.iL;
      if (s.iL > iMax) iMax = s.iL;
      if (n >= keepFrom) {
        waveform.t.push(s.t);
        waveform.vout.push(s.v);
        waveform.iL.push(s.iL);
      }
      n++;
    },
    (c: CycleRecord) => {
      dSum += c.duty;
      count++;
      dcm ||= c.dcm;
      saturated ||= c.saturated;
    },
  );
  return {
    summary: {
      voutAvg: vSum / n,
      voutRipplePp: vMax - vMin,
      inductorAvg: iSum / n,
      inductorRipplePp: iMax - iMin,
      duty: dSum / count,
      dcm,
      saturated,
    },
    waveform,
  };
};

export interface SwitchingStepResult {
  steadyState: SteadyStateSummary;
  /** The averaged prediction of the same step (step-response.ts). */
  averaged: StepResponseResult;
  /** Per switching cycle after the step (and a few before): start time, output average, min and max, duty. */
  cycles: { t: number[]; voutAvg: number[]; voutMin: number[]; voutMax: number[]; duty: number[] };
  /** Full-resolution waveform around the step (the first cycles after it). */
  waveform: Waveform;
  cycleCount: number;
  /** What the cycle-by-cycle run saw that the averaged model cannot: saturated duty, DCM. */
  outsideModel: string[];
}

const PRE_STEP_CYCLES = 5;
const WAVEFORM_CYCLES = 150;

/** Cycles the step window needs (settling, pre-step and the averaged window). */
export const estimateStepCycles = (request: AnalyzeRequest, step: StepDefinition): number => {
  const converter = stageBeforeStep(withLossDefaults(request.converter), step);
  const prepared = preparePlant({ ...request, converter });
  const averaged = simulateStepResponse(request, step, prepared);
  const windowS = averaged.t[averaged.t.length - 1];
  return settleCycles(prepared, request) + PRE_STEP_CYCLES + Math.ceil(windowS * converter.fsw);
};

const tooMuchWork = (cycles: number, path: string, hint: string) =>
  new EngineInputError([
    { path, message: `this needs about ${cycles} switching cycles, above the limit of ${MAX_SWITCHING_CYCLES} per run; ${hint}` },
  ]);

/**
 * The step of step-response.ts simulated cycle by cycle. @throws EngineInputError for
 * impossible input or work above MAX_SWITCHING_CYCLES.
 */
export const switchingStep = (request: AnalyzeRequest, step: StepDefinition, onProgress?: ProgressFn): SwitchingStepResult => {
  const converter: ConverterInput = stageBeforeStep(withLossDefaults(request.converter), step);
  const prepared = preparePlant({ ...request, converter });
  const averaged = simulateStepResponse(request, step, prepared);
  const windowS = averaged.t[averaged.t.length - 1];
  const settle = settleCycles(prepared, request);
  const after = Math.ceil(windowS * converter.fsw);
  const total = settle + PRE_STEP_CYCLES + after;
  if (total > MAX_SWITCHING_CYCLES) throw tooMuchWork(total, 'step', 'shorten the window with a faster loop, or a smaller slew time');
  const sim = simulatorFor(request, prepared);
  onProgress?.(0, 'settling');
  sim.runCycles(settle);
  const steady = measureSteadyState(sim, PRE_STEP_CYCLES);
  const t0 = sim.time();
  const cycles = { t: [] as number[], voutAvg: [] as number[], voutMin: [] as number[], voutMax: [] as number[], duty: [] as number[] };
  const waveform: Waveform = { t: [], vout: [], iL: [] };
  let saturatedCycles = 0;
  let dcmCycles = 0;
  if (step.kind === 'load') sim.stepLoad(step.to - step.from, step.slew ?? null);
  else sim.stepLine(step.to, step.slew ?? null);
  const chunk = 50;
  for (let done = 0; done < after; done += chunk) {
    const count = Math.min(chunk, after - done);
    let cycleIdx = done;
    let sum = 0;
    let k = 0;
    let lo = Infinity;
    let hi = -Infinity;
    let cycleStart = sim.time();
    sim.runCycles(
      count,
      (s) => {
        if (k === 0) cycleStart = s.t;
        sum += s.v;
        k++;
        if (s.v < lo) lo = s.v;
        if (s.v > hi) hi = s.v;
        if (cycleIdx < WAVEFORM_CYCLES) {
          waveform.t.push(s.t - t0);
          waveform.vout.push(s.v);
          waveform.iL.push(s.iL);
        }
      },
      (c) => {
        cycles.t.push(cycleStart - t0);
        cycles.voutAvg.push(sum / k);
        cycles.voutMin.push(lo);
        cycles.voutMax.push(hi);
        cycles.duty.push(c.duty);
        if (c.saturated) saturatedCycles++;
        if (c.dcm) dcmCycles++;
        sum = 0;
        k = 0;
        lo = Infinity;
        hi = -Infinity;
        cycleIdx++;
      },
    );
    onProgress?.((done + count) / after, 'step');
  }
  const outsideModel: string[] = [];
  if (saturatedCycles > 0) outsideModel.push(`the duty cycle hit its limit in ${saturatedCycles} cycle(s) after the step`);
  if (dcmCycles > 0) outsideModel.push(`the inductor current fell to zero (DCM) in ${dcmCycles} cycle(s) after the step`);
  return { steadyState: steady.summary, averaged, cycles, waveform, cycleCount: total, outsideModel };
};

export interface ModelCheckPoint {
  /** Injection frequency actually used (fsw/N), Hz. */
  hz: number;
  /** Loop gain T read from the simulated waveforms. */
  magDb: number;
  phaseDeg: number;
  /** The averaged model's T at hz. */
  modelMagDb: number;
  modelPhaseDeg: number;
  /** Simulated minus model. */
  errorDb: number;
  errorDeg: number;
  /** Injected amplitude, V. */
  amplitude: number;
}

export interface ModelCheckResult {
  points: ModelCheckPoint[];
  steadyState: SteadyStateSummary;
  /** Three periods of the steady state, for the ripple. */
  waveform: Waveform;
  cycleCount: number;
}

/** Default injection frequencies: six, log-spaced from fc/4 to fsw/3. */
export const defaultInjectionHz = (prepared: PreparedPlant, request: AnalyzeRequest): number[] => {
  const fsw = prepared.converter.fsw;
  const fc = marginsForCompensator(prepared, request.compensator).crossoverHz ?? fsw / 20;
  const lo = Math.min(fc / 4, fsw / 30);
  const hi = fsw / 3;
  return Array.from({ length: 6 }, (_, i) => lo * Math.pow(hi / lo, i / 5));
};

/** Periods of the switching frequency in one injection period (fsw/N, N ≥ 3). */
const periodsPer = (fsw: number, hz: number) => Math.max(3, Math.round(fsw / hz));

interface InjectionPlan {
  hz: number;
  n: number;
  settlePeriods: number;
  recordPeriods: number;
}

const planInjections = (fsw: number, fcHz: number, frequencies: number[]): InjectionPlan[] => {
  const ns = [...new Set(frequencies.map((f) => periodsPer(fsw, f)))].sort((a, b) => b - a);
  return ns.map((n) => ({
    hz: fsw / n,
    n,
    // Settle at least two injection periods and eight periods of fc; record at least 40 switching cycles.
    settlePeriods: Math.max(2, Math.ceil((8 * fsw) / fcHz / n)),
    recordPeriods: Math.max(2, Math.ceil(40 / n)),
  }));
};

/** Cycles a model check needs. */
export const estimateCheckCycles = (prepared: PreparedPlant, request: AnalyzeRequest, frequencies: number[]): number => {
  const fsw = prepared.converter.fsw;
  const fc = marginsForCompensator(prepared, request.compensator).crossoverHz ?? fsw / 20;
  const plans = planInjections(fsw, fc, frequencies);
  return settleCycles(prepared, request) + 3 + plans.reduce((s, p) => s + p.n * (p.settlePeriods + p.recordPeriods), 0);
};

/** Single-frequency DFT Σ x_k·e^{−jωt_k} (unscaled; only ratios are used). */
const dft = (x: number[], t: number[], w: number): [number, number] => {
  let re = 0;
  let im = 0;
  for (let k = 0; k < x.length; k++) {
    re += x[k] * Math.cos(w * t[k]);
    im -= x[k] * Math.sin(w * t[k]);
  }
  return [re, im];
};

/**
 * Loop gain from injections at `frequencies` (each moved to fsw/N), against the averaged
 * model. @throws EngineInputError for impossible input, frequencies outside 0…fsw/3, or
 * work above MAX_SWITCHING_CYCLES.
 */
export const modelCheck = (request: AnalyzeRequest, frequencies?: number[], onProgress?: ProgressFn): ModelCheckResult => {
  const prepared = preparePlant(request);
  const fsw = prepared.converter.fsw;
  const freqs = frequencies ?? defaultInjectionHz(prepared, request);
  const issues = freqs.flatMap((f, i) =>
    !(f > 0) || f > fsw / 3 + 1e-9 * fsw ? [{ path: `injection.frequencies.${i}`, message: `injections go from above 0 Hz up to fsw/3 (${(fsw / 3).toPrecision(4)} Hz)` }] : [],
  );
  if (freqs.length === 0 || freqs.length > MAX_INJECTIONS) issues.push({ path: 'injection.frequencies', message: `give 1 to ${MAX_INJECTIONS} frequencies` });
  if (issues.length > 0) throw new EngineInputError(issues);
  const total = estimateCheckCycles(prepared, request, freqs);
  if (total > MAX_SWITCHING_CYCLES) throw tooMuchWork(total, 'injection.frequencies', 'raise the lowest frequency (each injection runs whole periods of it)');
  const fc = marginsForCompensator(prepared, request.compensator).crossoverHz ?? fsw / 20;
  const control = switchControlOf(request);
  const sim = simulatorFor(request, prepared, control);
  onProgress?.(0, 'settling');
  const settle = settleCycles(prepared, request);
  sim.runCycles(settle);
  const steady = measureSteadyState(sim, 3, 3);
  const start = sim.snapshot();
  const blocks = loopBlocks(prepared, request.compensator);
  const pAt = complexAt(blocks.control);
  const gcAt = complexAt(blocks.compensator);
  const model = evaluateLoopGain(prepared, request.compensator);
  const range = control.mode === 'voltage' ? control.vramp : control.mode === 'peak-current' ? control.ri * prepared.operatingPoint.inductorRipplePp : 1;
  const plans = planInjections(fsw, fc, freqs);
  let done = settle;
  const points: ModelCheckPoint[] = [];
  for (const plan of plans) {
    const [pr, pi] = pAt(plan.hz);
    const [cr, ci] = gcAt(plan.hz);
    const tr = pr * cr - pi * ci;
    const ti = pr * ci + pi * cr;
    const onePlusT = Math.hypot(1 + tr, ti);
    // Small enough to stay linear (the boost's gain moves with D as 1/D'²): ≤ 0.5 % of the modulator's range at the compensator output, ≤ 0.2 % of vout at the output.
    const amplitude = Math.min((0.005 * range * onePlusT) / Math.hypot(cr, ci), (0.002 * prepared.converter.vout * onePlusT) / Math.hypot(tr, ti));
    sim.restore(start);
    sim.inject(plan.hz, amplitude);
    sim.runCycles(plan.n * plan.settlePeriods);
    const t: number[] = [];
    const v: number[] = [];
    const inj: number[] = [];
    sim.runCycles(plan.n * plan.recordPeriods, (s) => {
      t.push(s.t);
      v.push(s.vMean);
      inj.push(s.injMean);
    });
    const w = 2 * Math.PI * plan.hz;
    const [vr, vi] = dft(v, t, w);
    const [qr, qi] = dft(inj, t, w);
    // T = −V/(V + Q)
    const xr = vr + qr;
    const xi = vi + qi;
    const xx = xr * xr + xi * xi;
    const Tr = -(vr * xr + vi * xi) / xx;
    const Ti = -(vi * xr - vr * xi) / xx;
    const m = model(plan.hz);
    const magDb = 10 * Math.log10(Tr * Tr + Ti * Ti);
    const errorDeg = wrapDeg((Math.atan2(Ti, Tr) * 180) / Math.PI - m.phaseDeg);
    points.push({ hz: plan.hz, magDb, phaseDeg: m.phaseDeg + errorDeg, modelMagDb: m.magDb, modelPhaseDeg: m.phaseDeg, errorDb: magDb - m.magDb, errorDeg, amplitude });
    done += plan.n * (plan.settlePeriods + plan.recordPeriods);
    onProgress?.(done / total, `${plan.hz.toPrecision(3)} Hz`);
  }
  sim.inject(0, 0);
  points.sort((a, b) => a.hz - b.hz);
  return { points, steadyState: steady.summary, waveform: steady.waveform, cycleCount: total };
};
