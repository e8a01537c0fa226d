/**
 * The operating range's inputs and the margin targets: the names the range form, the range
 * schema's messages and the engine's range checks read. Values are stored in SI (tolerances as
 * fractions); `percent` fields are shown in % on the form.
 */

/** The range's quantities in words, as field messages name them. */
export const RANGE_QUANTITIES = {
  vin: { label: 'Input voltage', unit: 'V' },
  iout: { label: 'Load current', unit: 'A' },
  l: { label: 'Inductance', unit: '' },
  c: { label: 'Capacitance', unit: '' },
  rc: { label: 'Capacitor ESR', unit: 'Ω' },
  resistorTol: { label: 'Compensator resistor', unit: '' },
  capacitorTol: { label: 'Compensator capacitor', unit: '' },
  phaseMarginDeg: { label: 'Phase margin target', unit: '°' },
  gainMarginDb: { label: 'Gain margin target', unit: 'dB' },
} as const;

export type RangeFormField = 'vinMin' | 'vinMax' | 'ioutMin' | 'ioutMax' | 'lTol' | 'cTol' | 'rcMin' | 'rcMax' | 'rTol' | 'capTol' | 'pm' | 'gm';

export interface RangeInputSpec {
  /** The form's field name. */
  name: RangeFormField;
  label: string;
  unit: string;
  /** Path of the value in a request, as the engine's 422 issues name it. */
  path: string;
  /** Shown in % while stored as a fraction. */
  percent?: boolean;
  /** Empty = the parts series' own tolerance. */
  optional?: boolean;
  /** Zero allowed (ESR, tolerances, targets). */
  zero?: boolean;
}

export const RANGE_INPUTS: readonly RangeInputSpec[] = [
  { name: 'vinMin', label: `${RANGE_QUANTITIES.vin.label}, low line`, unit: 'V', path: 'range.vin.min' },
  { name: 'vinMax', label: `${RANGE_QUANTITIES.vin.label}, high line`, unit: 'V', path: 'range.vin.max' },
  { name: 'ioutMin', label: `${RANGE_QUANTITIES.iout.label}, light`, unit: 'A', path: 'range.iout.min' },
  { name: 'ioutMax', label: `${RANGE_QUANTITIES.iout.label}, full`, unit: 'A', path: 'range.iout.max' },
  { name: 'lTol', label: `${RANGE_QUANTITIES.l.label} tolerance ±`, unit: '%', path: 'range.l.tol', percent: true, zero: true },
  { name: 'cTol', label: `${RANGE_QUANTITIES.c.label} tolerance ±`, unit: '%', path: 'range.c.tol', percent: true, zero: true },
  { name: 'rcMin', label: 'ESR, hot (lowest)', unit: 'Ω', path: 'range.rc.min', zero: true },
  { name: 'rcMax', label: 'ESR, cold (highest)', unit: 'Ω', path: 'range.rc.max', zero: true },
  { name: 'rTol', label: `${RANGE_QUANTITIES.resistorTol.label}s ±`, unit: '%', path: 'range.parts.resistorTol', percent: true, optional: true, zero: true },
  { name: 'capTol', label: `${RANGE_QUANTITIES.capacitorTol.label}s ±`, unit: '%', path: 'range.parts.capacitorTol', percent: true, optional: true, zero: true },
  { name: 'pm', label: RANGE_QUANTITIES.phaseMarginDeg.label, unit: RANGE_QUANTITIES.phaseMarginDeg.unit, path: 'targets.phaseMarginDeg', zero: true },
  { name: 'gm', label: RANGE_QUANTITIES.gainMarginDb.label, unit: RANGE_QUANTITIES.gainMarginDb.unit, path: 'targets.gainMarginDb', zero: true },
];

/** Cross-field messages of the range form. */
export const RANGE_ORDER_MESSAGES = {
  vinMax: 'High line must be at least the low line',
  ioutMax: 'Full load must be at least the light load',
  rcMax: 'Cold ESR must be at least the hot ESR',
} as const;
