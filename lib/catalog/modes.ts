/**
  * The control modes and error amplifiers beside their names (topologies.ts): help and choices, one home for the Tune screen, the
 * revision diff, the report and every other place that names them.
 */
import { AMPLIFIERS, MODULATOR_MODES, type Amplifier, type ModulatorMode } from '../engine/types';
import { AMPLIFIER_LABELS, MODULATOR_MODE_LABELS } from './topologies';

/** One line a designer reads when choosing. */
export const MODE_HELP: Readonly<Record<ModulatorMode, string>> = {
  voltage: 'The compensator output meets a fixed ramp; the modulator gain is 1/Vramp.',
  'peak-current': 'The switch turns off when the sensed current plus the external ramp meets the compensator output (Ridley 1991 model).',
};
export const AMPLIFIER_HELP: Readonly<Record<Amplifier, string>> = {
  opamp: 'Inverting op-amp stage; its input is a virtual ground, so the divider is outside the loop.',
  transconductance: 'gm amplifier at a COMP pin: R2–C1 and C2 to ground at its output; the divider is part of the loop.',
};

export const MODE_OPTIONS = MODULATOR_MODES.map((m) => ({ value: m, label: MODULATOR_MODE_LABELS[m] }));
export const AMPLIFIER_OPTIONS = AMPLIFIERS.map((a) => ({ value: a, label: AMPLIFIER_LABELS[a] }));

/**
 * The power-stage trace as the loop uses it, per control mode and conduction: voltage mode
 * divides the duty-to-output response by the ramp, peak current mode closes the current loop
 * first and gives control-to-output Gvc (Ridley 1991 in CCM); in DCM the averaged-switch model
 * (Erickson & Maksimović, 2nd ed., ch. 15) holds either way.
 */
export function plantTraceName(mode: ModulatorMode, conduction: 'CCM' | 'DCM'): string {
  const dcm = conduction === 'DCM' ? ', DCM model' : '';
  return mode === 'peak-current' ? `Power stage Gvc (current mode${dcm})` : `Power stage Gvd/Vramp${dcm ? ` (DCM model)` : ''}`;
}
