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

/** The error amplifier of the compensator: an inverting op-amp network. */
export const AMPLIFIERS = ['opamp'] as const;
export type Amplifier = (typeof AMPLIFIERS)[number];

/** How the modulator turns the control voltage into duty: a fixed ramp (voltage mode). */
export const MODULATOR_MODES = ['voltage'] as const;
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

/** Voltage-mode PWM: modulator gain is 1/vramp. `mode` absent means 'voltage'. */
export interface ModulatorInput {
  mode?: ModulatorMode;
  vramp: number;
}

export interface FeedbackInput {
  /** Error-amplifier reference voltage, V. */
  vref: number;
}

/**
 * Inverting op-amp compensator. R1 from the output to the inverting input;
 * R2 in series with C1 in the feedback path; C2 across the feedback path
 * (0 = absent); R3 in series with C3 across R1 (Type III only).
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

export interface AnalyzeRequest {
  converter: ConverterInput;
  modulator: ModulatorInput;
  feedback: FeedbackInput;
  compensator: CompensatorInput;
  parts?: PartsOptions;
  sweep?: SweepOptions;
}

export interface OperatingPoint {
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
  /** 'DCM' when the given load is below the CCM/DCM boundary. */
  conduction: 'CCM' | 'DCM';
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

export interface AnalyzeResult {
  operatingPoint: OperatingPoint;
  /** Control-to-output including the modulator: Gvd/Vramp (buck-boost sign-corrected). */
  plant: TransferSummary;
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
 */
export interface CompensatorShape {
  type: CompensatorType;
  r1: number;
  integratorHz: number;
  zerosHz: number[];
  polesHz: number[];
}
