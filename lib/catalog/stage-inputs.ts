/**
 * The power-stage inputs: one entry per number a designer types on the Tune
 * screen. The stage form, the starting-point form, the revision diff, the
 * report and the validation messages read their label, symbol, unit, bound and
 * help from here.
 *
 * To add an input (for example a current-sense gain for peak-current mode):
 * add the field to the engine's request type, to the zod schema, and one entry
 * below — with `appliesTo` when it only means something in one mode.
 */
import type { Amplifier, AnalyzeRequest, ModulatorMode } from '../engine/types';

/** SI base units only; the name says it (V, A, Hz, H, F, Ω, or a plain ratio). */
export type InputUnit = 'V' | 'A' | 'Hz' | 'H' | 'F' | 'Ω' | 'A/V' | 'V/A' | 'V/s' | 'S' | '';

/** `positive`: above 0; `nonNegative`: 0 allowed (0 means absent or ideal). */
export type InputBound = 'positive' | 'nonNegative';

type StageSection = 'converter' | 'modulator' | 'feedback';
/** The numeric fields of one section of the request (of every member, for the modulator's union). */
type NumericField<T> = T extends unknown ? { [K in keyof T]-?: NonNullable<T[K]> extends number ? K : never }[keyof T] & string : never;
/** The part of the request the stage inputs edit. */
export type Stage = Pick<AnalyzeRequest, StageSection>;

interface InputBase {
  /** Where it shows: the form's groups and the diff's groups. */
  group: 'Power stage' | 'Modulator' | 'Feedback';
  /** Words first, then the symbol: "Input voltage". */
  label: string;
  /** The textbook symbol: "Vin". */
  symbol: string;
  unit: InputUnit;
  bound: InputBound;
  /** One line a designer reads when unsure what to enter. */
  help: string;
  /** Shown as a plain number (0.8) rather than with an SI prefix (800m). */
  plain?: boolean;
  /** What 0 means, where it means something ("synchronous"). */
  zeroMeans?: string;
  /** Value when the request leaves it out (optional fields only). */
  defaultValue?: number;
  /** Only in these modes; absent means always. */
  appliesTo?: { modulator?: readonly ModulatorMode[]; amplifier?: readonly Amplifier[] };
}

export type InputSpec = {
  [S in StageSection]: InputBase & { section: S; field: NumericField<Stage[S]> };
}[StageSection];

export const STAGE_INPUTS: readonly InputSpec[] = [
  { section: 'converter', field: 'vin', group: 'Power stage', label: 'Input voltage', symbol: 'Vin', unit: 'V', bound: 'positive', plain: true, help: 'Nominal input; the sign is set by the topology.' },
  { section: 'converter', field: 'vout', group: 'Power stage', label: 'Output voltage', symbol: 'Vout', unit: 'V', bound: 'positive', plain: true, help: 'Magnitude; the buck-boost output is inverted.' },
  { section: 'converter', field: 'iout', group: 'Power stage', label: 'Load current', symbol: 'Iout', unit: 'A', bound: 'positive', plain: true, help: 'The load the loop is designed at.' },
  { section: 'converter', field: 'fsw', group: 'Power stage', label: 'Switching frequency', symbol: 'fsw', unit: 'Hz', bound: 'positive', help: 'The averaged model holds up to about fsw/2.' },
  { section: 'converter', field: 'l', group: 'Power stage', label: 'Inductance', symbol: 'L', unit: 'H', bound: 'positive', help: 'At the operating current (after DC-bias derating).' },
  { section: 'converter', field: 'rl', group: 'Power stage', label: 'Inductor winding resistance', symbol: 'RL', unit: 'Ω', bound: 'nonNegative', defaultValue: 0, help: 'DC resistance (DCR) of the winding; damps the LC resonance.' },
  { section: 'converter', field: 'c', group: 'Power stage', label: 'Output capacitance', symbol: 'C', unit: 'F', bound: 'positive', help: 'Effective value at Vout (ceramics lose much of it with DC bias).' },
  { section: 'converter', field: 'rc', group: 'Power stage', label: 'Capacitor series resistance', symbol: 'RC', unit: 'Ω', bound: 'nonNegative', defaultValue: 0, help: 'ESR; sets the ESR zero 1/(2π·RC·C).' },
  { section: 'converter', field: 'vd', group: 'Power stage', label: 'Diode drop', symbol: 'Vd', unit: 'V', bound: 'nonNegative', defaultValue: 0, plain: true, zeroMeans: 'synchronous', help: '0 = synchronous switch.' },
  { section: 'modulator', field: 'vramp', group: 'Modulator', label: 'PWM ramp', symbol: 'Vramp', unit: 'V', bound: 'positive', plain: true, help: 'Peak-to-peak ramp; the modulator gain is 1/Vramp.', appliesTo: { modulator: ['voltage'] } },
  { section: 'modulator', field: 'ri', group: 'Modulator', label: 'Current-sense gain', symbol: 'Ri', unit: 'V/A', bound: 'positive', plain: true, help: 'Sensed volts per ampere of inductor (switch) current.', appliesTo: { modulator: ['peak-current'] } },
  { section: 'modulator', field: 'se', group: 'Modulator', label: 'External ramp', symbol: 'Se', unit: 'V/s', bound: 'nonNegative', defaultValue: 0, zeroMeans: 'none', help: 'Slope compensation added to the sensed current; needed above D = 0.5.', appliesTo: { modulator: ['peak-current'] } },
  { section: 'feedback', field: 'vref', group: 'Feedback', label: 'Reference', symbol: 'Vref', unit: 'V', bound: 'positive', plain: true, help: 'Error-amplifier reference; sets the divider.' },
];

/** "converter.vin" — the path the API's field issues use. */
export const inputPath = (spec: InputSpec): string => `${spec.section}.${spec.field}`;

/** "Input voltage Vin" — as a form label or a table row. */
export const inputLabel = (spec: InputSpec): string => `${spec.label} ${spec.symbol}`;

/** The entry for a path such as "converter.vin" (or "input.converter.vin"), or null. */
export function inputByPath(path: string): InputSpec | null {
  const p = path.replace(/^input\./, '');
  return STAGE_INPUTS.find((s) => inputPath(s) === p) ?? null;
}

/** Whether an input means something for this request's modulator and amplifier. */
export function inputApplies(spec: InputSpec, req: { modulator: { mode?: ModulatorMode }; compensator?: { amplifier?: Amplifier } }): boolean {
  const mode = req.modulator.mode ?? 'voltage';
  const amplifier = req.compensator?.amplifier ?? 'opamp';
  const a: InputBase['appliesTo'] = spec.appliesTo;
  if (a?.modulator && !a.modulator.includes(mode)) return false;
  if (a?.amplifier && !a.amplifier.includes(amplifier)) return false;
  return true;
}

/** The value of one input in a stage (its default when left out), or null when absent. */
export function readInput(stage: Stage, spec: InputSpec): number | null {
  let v: number | undefined;
  switch (spec.section) {
    case 'converter':
      v = stage.converter[spec.field];
      break;
    case 'modulator': {
      // Each mode has its own fields; one the stage's mode lacks reads as absent.
      const m: unknown = Reflect.get(stage.modulator, spec.field);
      v = typeof m === 'number' ? m : undefined;
      break;
    }
    case 'feedback':
      v = stage.feedback[spec.field];
      break;
  }
  return v ?? spec.defaultValue ?? null;
}
