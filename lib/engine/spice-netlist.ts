/**
 * SPICE netlist of a design for an AC check of the loop gain in ngspice (and for Handoff).
 *
 * The power stage is the large-signal state-space-averaged model (the same interval
 * equations as plant.ts), written with behavioural sources whose duty is a node voltage, so
 * the simulator finds the DC operating point itself and linearises around it. The op-amp
 * compensator is built from its parts around a high-gain VCVS (an ideal op-amp), followed by
 * the PWM gain 1/Vramp. The loop is closed at DC and broken for AC by a series voltage
 * source between the sensed output and R1 (Middlebrook's injection; exact here because the
 * sensing is an ideal buffer), so T = −V(sense)/V(fb).
 *
 * For the inverting buck-boost the output node is negative and the controller is taken as
 * referenced to the negative output: it senses |Vout| = V(0) − V(out).
 */
import { computeOperatingPoint, withLossDefaults } from './steady-state';
import { dividerRb } from './compensator';
import type { AnalyzeRequest } from './types';

export interface SpiceNetlistOptions {
  /** First (title) line of the netlist. */
  title?: string;
  /** AC sweep, Hz; defaults to the request's sweep or 10 Hz … fsw/2. */
  fStart?: number;
  fStop?: number;
  pointsPerDecade?: number;
  /** Gain of the ideal op-amp (VCVS), default 1e8. */
  opAmpGain?: number;
  /** Lower divider resistor, Ω; defaults to the exact value for Vout (a built board uses a standard one). */
  rb?: number;
}

/** A value as SPICE reads it (plain decimal or exponent form, 12 significant digits). */
const v = (x: number): string => String(Number(x.toPrecision(12)));

/**
 * Build the netlist (a string that `ngspice -b` runs as it is). It prints the DC duty
 * (V(duty)) found by the simulator, then a table of frequency, loop gain in dB (loopdb) and
 * continuous phase in degrees (loopdeg), and quits (exit status 0).
 */
export const buildSpiceNetlist = (req: AnalyzeRequest, options: SpiceNetlistOptions = {}): string => {
  const cv = withLossDefaults(req.converter);
  const op = computeOperatingPoint(cv);
  const r = op.loadResistance;
  const kR = r / (r + cv.rc);
  const rp = (r * cv.rc) / (r + cv.rc);
  const inverted = cv.topology === 'buck-boost';
  const sign = inverted ? -1 : 1;
  const comp = req.compensator;
  const rb = options.rb ?? dividerRb(comp.r1, req.feedback.vref, cv.vout);
  const fStart = options.fStart ?? req.sweep?.fStart ?? 10;
  const fStop = options.fStop ?? req.sweep?.fStop ?? cv.fsw / 2;
  const ppd = options.pointsPerDecade ?? 20;
  const gainA = options.opAmpGain ?? 1e8;
  const cx = cv.rc > 0 ? 'cx' : 'out';
  // Output voltage during the interval the inductor feeds the output: kR·vC + Rp·iL (signed).
  const vOff = cv.rc > 0 ? `(${v(kR)}*V(cx) ${inverted ? '-' : '+'} ${v(rp)}*I(Vls))` : 'V(out)';

  const lines: string[] = [];
  const add = (...l: string[]) => lines.push(...l);
  add(
    `* ${options.title ?? `Phasewright loop check: ${cv.topology} ${v(cv.vin)} V to ${inverted ? '-' : ''}${v(cv.vout)} V`}`,
    `* State-space averaged power stage, op-amp compensator (${comp.type}), PWM gain 1/Vramp.`,
    `* Engine operating point: D = ${op.duty.toPrecision(6)}, IL = ${op.inductorCurrent.toPrecision(6)} A.`,
    `* Loop gain T = -V(sense)/V(fb), injected by Vinj.`,
    '',
    '* --- power stage ---',
    `Vin in 0 DC ${v(cv.vin)}`,
  );
  const inductor = (from: string, to: string) => {
    if (cv.rl > 0) add(`Rl ${from} lx ${v(cv.rl)}`, `L1 lx ${to} ${v(cv.l)}`);
    else add(`L1 ${from} ${to} ${v(cv.l)}`);
  };
  if (cv.topology === 'buck') {
    add(`Bsw sw 0 V = V(duty)*V(in) - (1-V(duty))*${v(cv.vd)}`);
    inductor('sw', 'ls');
    add('Vls ls out 0');
  } else if (cv.topology === 'boost') {
    inductor('in', 'sw');
    add('Vls sw swx 0', `Bsw swx 0 V = (1-V(duty))*(${vOff} + ${v(cv.vd)})`, 'Bd 0 out I = (1-V(duty))*I(Vls)');
  } else {
    add(`Bsw a 0 V = V(duty)*V(in) + (1-V(duty))*(${vOff} - ${v(cv.vd)})`);
    inductor('a', 'ls');
    add('Vls ls 0 0', 'Bd out 0 I = (1-V(duty))*I(Vls)');
  }
  if (cv.rc > 0) add(`Rc out cx ${v(cv.rc)}`);
  add(`Cout ${cx} 0 ${v(cv.c)}`, `Rload out 0 ${v(r)}`, '');

  add(
    '* --- sensing and loop break ---',
    inverted ? 'Esense sense 0 0 out 1' : 'Esense sense 0 out 0 1',
    'Vinj fb sense DC 0 AC 1',
    '',
    '* --- compensator (ideal op-amp) and modulator ---',
    `Vref ref 0 DC ${v(req.feedback.vref)}`,
    `R1 fb inv ${v(comp.r1)}`,
    `Rb inv 0 ${v(rb)}`,
    `Eamp ctl 0 ref inv ${v(gainA)}`,
  );
  if (comp.type === 'type1') {
    add(`C1 inv ctl ${v(comp.c1)}`);
  } else {
    add(`R2 inv n2 ${v(comp.r2!)}`, `C1 n2 ctl ${v(comp.c1)}`);
    if ((comp.c2 ?? 0) > 0) add(`C2 inv ctl ${v(comp.c2!)}`);
    if (comp.type === 'type3') add(`R3 fb n3 ${v(comp.r3!)}`, `C3 n3 inv ${v(comp.c3!)}`);
  }
  add(
    `Eduty duty 0 ctl 0 ${v(1 / req.modulator.vramp)}`,
    '',
    `.nodeset V(duty)=${v(op.duty)} V(ctl)=${v(op.duty * req.modulator.vramp)} V(out)=${v(sign * cv.vout)} V(inv)=${v(req.feedback.vref)}`,
    '.options reltol=1e-6 vntol=1e-9 abstol=1e-12',
    `.ac dec ${ppd} ${v(fStart)} ${v(fStop)}`,
    '',
    '.control',
    'set width=200',
    'set height=100000',
    'op',
    'print V(duty)',
    'run',
    'let loopgain = -v(sense)/v(fb)',
    'let loopdb = db(loopgain)',
    'let loopdeg = cph(loopgain)*180/pi',
    'print loopdb loopdeg',
    'quit',
    '.endc',
    '.end',
    '',
  );
  return lines.join('\n');
};
