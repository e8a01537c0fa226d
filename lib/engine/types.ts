/**
 * Shared types of the analysis engine: the contract of POST /api/analyze.
 *
 * All quantities are in SI base units (V, A, Hz, H, F, Ω) unless the name
 * says otherwise (`…Hz`, `…Db`, `…Deg`). "Not found" or "not applicable" is
 * `null`, never 0 or NaN. This module imports nothing.
 */

/*
 * The closed lists of the contract, as `as const` tuples: the zod schemas
 * (lib/validation/analyze.ts), the database enums (db/schema.ts) and the
 * catalogue (lib/catalog/) are all built from these, so adding a member here
 * is the one place a list grows.
 */
export const TOPOLOGIES = ['buck', 'boost', 'buck-boost'] as const;
export type Topology = (typeof TOPOLOGIES)[number];

export const COMPENSATOR_TYPES = ['type1', 'type2', 'type3'] as const;
export type CompensatorType = (typeof COMPENSATOR_TYPES)[number];

/** Error amplifiers: inverting op-amp stage or transconductance (gm) amplifier at a COMP pin. */
export const AMPLIFIERS = ['opamp', 'transconductance'] as const;
export type Amplifier = (typeof AMPLIFIERS)[number];

/** Modulator modes: voltage-mode PWM (ramp Vramp) or peak current mode (sense gain Ri, external ramp Se). */
export const MODULATOR_MODES = ['voltage', 'peak-current'] as const;
export type ModulatorMode = (typeof MODULATOR_MODES)[number];

export const E_SERIES_NAMES = ['E6', 'E12', 'E24', 'E48', 'E96', 'E192'] as const;
export type ESeriesName = (typeof E_SERIES_NAMES)[number];

/** Power stage. vin and vout are magnitudes; the buck-boost output is inverted. */
export interface ConverterInput {
  topology: Topology;
  vin: number;
  vout: number;
  iout: number;
  fsw: number;
  l: number;
  /** Inductor DC resistance (DCR), Ω. */
  rl: number;
  c: number;
  /** Output capacitor ESR, Ω. */
  rc: number;
  /** Diode forward drop, V; 0 means a synchronous switch. */
  vd: number;
}

/** Voltage-mode PWM: modulator gain is 1/vramp. A modulator without `mode` is voltage mode. */
export interface VoltageModulatorInput {
  mode?: 'voltage';
  /** Peak-to-peak PWM ramp, V. */
  vramp: number;
}

/**
 * Peak current mode (Ridley 1991): the switch turns off when Ri·iL plus the external ramp
 * reaches the control voltage.
 */
export interface PeakCurrentModulatorInput {
  mode: 'peak-current';
  /** Current-sense gain, V/A (Ω). */
  ri: number;
  /** External (compensating) ramp slope, V/s; 0 = none. */
  se: number;
}

export type ModulatorInput = VoltageModulatorInput | PeakCurrentModulatorInput;

export interface FeedbackInput {
  /** Error-amplifier reference voltage, V. */
  vref: number;
}

/** Single-pole op-amp A(s) = a0/(1 + s·a0/(2π·gbw)). */
export interface OpAmpModel {
  /** Open-loop DC gain, V/V. */
  a0: number;
  /** Gain-bandwidth product, Hz. */
  gbw: number;
}

/**
 * Compensator. With amplifier "opamp" (the default): inverting op-amp stage, R1 from the
 * output to the inverting input; R2 in series with C1 in the feedback path; C2 across the
 * feedback path (0 = absent); R3 in series with C3 across R1 (Type III only); `opamp`
 * optionally gives a finite gain and bandwidth (absent = ideal).
 * With amplifier "transconductance" (Type II and III): R1 divider top (output to the feedback
 * pin), Rb divider bottom, R2 in series with C1 from the amplifier output to ground, C2 from
 * the amplifier output to ground (optional), R3 in series with C3 across R1 (Type III);
 * gm in S, ro the amplifier's output resistance (absent = infinite).
 * Parts a type does not use are ignored (and may be omitted).
 */
export interface CompensatorInput {
  type: CompensatorType;
  /** Absent means 'opamp'. */
  amplifier?: Amplifier;
  r1: number;
  r2?: number;
  r3?: number;
  c1: number;
  c2?: number;
  c3?: number;
  /** Transconductance, S (transconductance amplifier). */
  gm?: number;
  /** Output resistance of the gm amplifier, Ω; absent = infinite. */
  ro?: number;
  /** Divider bottom resistor, Ω (transconductance amplifier: part of the loop). */
  rb?: number;
  /** Finite op-amp (op-amp stage only); absent = ideal. */
  opamp?: OpAmpModel;
}

export interface PartsOptions {
  resistorSeries: ESeriesName;
  capacitorSeries: ESeriesName;
}

export interface SweepOptions {
  fStart: number;
  fStop: number;
  points: number;
}

/** A load or line step for the step response and the switching check (stored with a revision). */
export interface StepDefinition {
  kind: 'load' | 'line';
  /** Load current (A) or input voltage (V) before the step. */
  from: number;
  /** … and after it. */
  to: number;
  /** A/s or V/s; absent or null = ideal step. */
  slew?: number | null;
  /** Settling band relative to vout (0.01 = ±1 %). */
  band?: number;
}

export interface AnalyzeRequest {
  converter: ConverterInput;
  modulator: ModulatorInput;
  feedback: FeedbackInput;
  compensator: CompensatorInput;
  parts?: PartsOptions;
  sweep?: SweepOptions;
  /** The step the designer checks on Tune's closed-loop view; the analysis ignores it. */
  step?: StepDefinition;
}

export interface OperatingPoint {
  /** Duty of the switch; in DCM from the DCM steady state. */
  duty: number;
  /** D' = 1 − D */
  dutyComplement: number;
  /** Load resistance vout/iout, Ω. */
  loadResistance: number;
  /** Average inductor current, A. */
  inductorCurrent: number;
  /** Peak-to-peak inductor ripple, A. */
  inductorRipplePp: number;
  inductorPeak: number;
  /** Output ripple, V peak-to-peak: total, capacitive part, ESR part. */
  outputRipplePp: number;
  outputRippleCapPp: number;
  outputRippleEsrPp: number;
  /** 'DCM' when the given load is below the CCM/DCM boundary (the DCM model is then used). */
  conduction: 'CCM' | 'DCM';
  /** DCM only: the diode (second-interval) duty D2; null in CCM. */
  dcmDiodeDuty: number | null;
  /** Smallest inductance keeping CCM at this load, H. */
  criticalInductance: number;
  /** Load current below which the stage enters DCM, A. */
  criticalLoadCurrent: number;
}

/** Landmarks of a rational transfer function, frequencies in Hz. */
export interface TransferSummary {
  /** 20·log10|H(0)|; null when H has a zero or pole at the origin (e.g. Zout with rl = 0). */
  dcGainDb: number | null;
  resonanceHz: number | null;
  q: number | null;
  esrZeroHz: number | null;
  /** Right-half-plane zero; null for the buck. */
  rhpZeroHz: number | null;
  /** Every pole and zero as frequency magnitudes (Hz); complex pairs listed once each root. */
  polesHz: number[];
  zerosHz: number[];
}

export interface CompensatorSummary {
  type: CompensatorType;
  amplifier: Amplifier;
  /** Origin pole listed as 0. */
  polesHz: number[];
  zerosHz: number[];
  /** Gain of the flat mid-band region in dB (Type II: R2·C1/(R1(C1+C2)); Type III: that × (R1+R3)/R3); null for Type I. */
  midbandGainDb: number | null;
  /** Frequency where the integrator asymptote 1/(s·R1·(C1+C2)) crosses 0 dB, Hz. */
  integratorHz: number;
}

export interface Crossing {
  kind: 'gain' | 'phase';
  hz: number;
  direction: 'down' | 'up';
}

export interface Margins {
  crossoverHz: number | null;
  phaseMarginDeg: number | null;
  gainMarginDb: number | null;
  /** Frequency of the −180° crossing used for the gain margin. */
  phaseCrossoverHz: number | null;
  crossings: Crossing[];
}

export interface PartValues {
  r1: number;
  r2: number | null;
  r3: number | null;
  c1: number;
  c2: number | null;
  c3: number | null;
  /** Lower divider resistor for the DC set point. */
  rb: number | null;
}

export interface PartsResult {
  resistorSeries: ESeriesName;
  capacitorSeries: ESeriesName;
  ideal: PartValues;
  snapped: PartValues;
  snappedMargins: Margins;
}

export interface BodeTrace {
  magDb: number[];
  phaseDeg: number[];
}

/**
 * Sampled Bode data (log-spaced). POST /api/analyze answers every array rounded to 6
 * significant digits (see precision.ts) and leaves `bode` out when asked for no arrays.
 */
export interface BodeData {
  f: number[];
  loop: BodeTrace;
  plant: BodeTrace;
  compensator: BodeTrace;
}

export type CheckLevel = 'note' | 'caution' | 'risk';

export interface Check {
  id: string;
  level: CheckLevel;
  message: string;
}

/**
 * The modulator at the operating point. Voltage mode: gain 1/Vramp. Peak current mode
 * (Ridley 1991): sensed slopes Sn (on-time) and Sf (off-time), mc = 1 + Se/Sn,
 * Qp = 1/(π(mc·D' − 0.5)) of the double pole at fsw/2 (null in DCM, where the current loop
 * has no sampling pair), and the external ramp needed for Qp = 1 and for stability.
 */
export type ModulatorSummary =
  | { mode: 'voltage'; vramp: number; gain: number }
  | {
      mode: 'peak-current';
      ri: number;
      se: number;
      /** Sensed on-time slope Ri·m1, V/s. */
      sn: number;
      /** Sensed off-time slope Ri·m2, V/s. */
      sf: number;
      mc: number;
      qp: number | null;
      /** The sampling double pole, fsw/2, Hz (null in DCM). */
      samplingPoleHz: number | null;
      /** External ramp giving Qp = 1 at this duty, V/s (0 when none is needed). */
      seForQp1: number;
      /** External ramp below which the current loop is subharmonically unstable at this duty, V/s (0 when none is needed). */
      seMinStable: number;
    };

export interface AnalyzeResult {
  operatingPoint: OperatingPoint;
  /**
   * Control-to-output including the modulator: voltage mode Gvd/Vramp, peak current mode
   * Gvc (Ridley 1991); in DCM the DCM model's. Buck-boost sign-corrected.
   */
  plant: TransferSummary;
  modulator: ModulatorSummary;
  /** DCM only: the low-frequency pole of the DCM model, Hz (null in CCM). */
  dcmPoleHz: number | null;
  lineToOutput: TransferSummary;
  outputImpedance: TransferSummary;
  compensator: CompensatorSummary;
  margins: Margins;
  /** Phase of the loop gain at fsw/2, degrees (unwrapped as the sweep). */
  phaseAtHalfFswDeg: number | null;
  parts: PartsResult;
  /** Absent from POST /api/analyze's answer when the request asks for no arrays. */
  bode: BodeData;
  checks: Check[];
}

/** A field-named problem; the API answers these as { error, issues }. */
export interface FieldIssue {
  path: string;
  message: string;
}

/** Thrown for physically impossible input (maps to HTTP 422). */
export class EngineInputError extends Error {
  readonly issues: FieldIssue[];
  constructor(issues: FieldIssue[]) {
    super(issues.map((i) => `${i.path}: ${i.message}`).join('; '));
    this.name = 'EngineInputError';
    this.issues = issues;
  }
}

/**
 * The compensator as the Tune handles see it: integrator 0 dB frequency plus
 * zeros and poles (Hz, origin pole excluded), with R1 held fixed.
 * Type I: zerosHz [], polesHz []. Type II: zerosHz [fz], polesHz [fp] or [] when C2 = 0.
 * Type III: zerosHz [fz1 (R2·C1), fz2 ((R1+R3)·C3)], polesHz [fp1 (R2, C1‖C2 series), fp2 (R3·C3)].
 * Transconductance amplifier: the same list; fp2 is 1/(2π(R3 + R1∥Rb)C3) and the integrator
 * 0 dB frequency gm·H0/(2π(C1+C2)) with H0 = Rb/(R1+Rb).
 */
export interface CompensatorShape {
  type: CompensatorType;
  r1: number;
  /**
   * Everything of the compensator the handles do not move (amplifier, gm, ro, rb, op-amp
   * model), carried through partsFromShape unchanged.
   */
  fixed?: Pick<CompensatorInput, 'amplifier' | 'gm' | 'ro' | 'rb' | 'opamp'>;
  integratorHz: number;
  zerosHz: number[];
  polesHz: number[];
}
