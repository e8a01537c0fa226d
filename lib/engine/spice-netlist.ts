/**
 * SPICE netlist of a design for an AC check of the loop gain in ngspice (and for Handoff).
 *
 * Power stage, CCM: the large-signal state-space-averaged model (the same interval equations
 * as plant.ts), written with behavioural sources whose duty is a node voltage, so the
 * simulator finds the DC operating point itself and linearises around it.
 * Power stage, DCM: the reduced-order averaged switch network (Erickson & Maksimović,
 * Fundamentals of Power Electronics, 2nd ed., ch. 15) as a behavioural current source that
 * delivers i2(ipk, vg, v) to the output node (the inductor, which holds no energy from one
 * cycle to the next, is not a state).
 *
 * Modulator: voltage mode, the PWM gain 1/Vramp (in DCM followed by the ch. 15 high-frequency
 * pole as an RC). Peak current mode, CCM: Ridley's modulator (IEEE Trans. Power Electronics,
 * 1991), d = D + Fm·[(vc − Vc) − Ri·(He·iL − IL) + kf·(vg − Vg) + kr·(v − V)], with the
 * sampling gain He(s) = 1 − s·Ts/2 + s²·Ts²/π² applied to the inductor current as a
 * second-order network: He·iL = iL − (Ts/2)·vL/L + (Ts²/π²)·(dvL/dt)/L, since diL/dt = vL/L
 * (the derivative of vL is the current of a 1 F capacitor driven by a copy of vL). Peak
 * current mode, DCM: the peak ipk = vc/(Ri + Se·L/vOn) feeds the DCM switch network.
 *
 * Error amplifier: an op-amp stage from its parts around a high-gain VCVS (ideal) or a
 * single-pole op-amp a0/(1 + s·a0/(2π·GBW)) (VCVS, RC, buffer); or a transconductance
 * amplifier (G element, gm) driving R2–C1, C2 and ro at its output from the divider's tap.
 * The loop is closed at DC and broken for AC by a series voltage source between the sensed
 * output and R1 (Middlebrook's injection; exact here because the sensing is an ideal buffer),
 * so T = −V(sense)/V(fb).
 *
 * For the inverting buck-boost the output node is negative and the controller is taken as
 * referenced to the negative output: it senses |Vout| = V(0) − V(out).
 */
import { withLossDefaults } from './steady-state';
import { buildControlPlant, ridleyGains } from './control';
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
  const control = buildControlPlant(cv, req.modulator);
  const op = control.operatingPoint;
  const dcm = op.conduction === 'DCM';
  const mod = req.modulator;
  const r = op.loadResistance;
  const kR = r / (r + cv.rc);
  const rp = (r * cv.rc) / (r + cv.rc);
  const inverted = cv.topology === 'buck-boost';
  const sign = inverted ? -1 : 1;
  const comp = req.compensator;
  const gmStage = comp.amplifier === 'transconductance';
  // A gm stage's own Rb is part of its loop; otherwise the caller's (standard) Rb, else the exact one.
  const rb = gmStage && comp.rb !== undefined ? comp.rb : (options.rb ?? dividerRb(comp.r1, req.feedback.vref, cv.vout));
  const fStart = options.fStart ?? req.sweep?.fStart ?? 10;
  const fStop = options.fStop ?? req.sweep?.fStop ?? cv.fsw / 2;
  const ppd = options.pointsPerDecade ?? 20;
  const gainA = options.opAmpGain ?? 1e8;
  const cx = cv.rc > 0 ? 'cx' : 'out';
  // Output voltage during the interval the inductor feeds the output: kR·vC + Rp·iL (signed).
  const vOff = cv.rc > 0 ? `(${v(kR)}*V(cx) ${inverted ? '-' : '+'} ${v(rp)}*I(Vls))` : 'V(out)';
  const vMag = inverted ? '(-V(out))' : 'V(out)';
  const modeText = mod.mode === 'peak-current' ? `peak current mode (Ri ${v(mod.ri)} V/A, Se ${v(mod.se)} V/s)` : `voltage mode (Vramp ${v(mod.vramp)} V)`;
  const ampText = gmStage ? `transconductance amplifier (gm ${v(comp.gm ?? 0)} S)` : comp.opamp ? `op-amp a0 ${v(comp.opamp.a0)}, GBW ${v(comp.opamp.gbw)} Hz` : 'ideal op-amp';

  const lines: string[] = [];
  const add = (...l: string[]) => lines.push(...l);
  add(
    `* ${options.title ?? `Phasewright loop check: ${cv.topology} ${v(cv.vin)} V to ${inverted ? '-' : ''}${v(cv.vout)} V`}`,
    `* ${dcm ? 'DCM averaged switch network (reduced order)' : 'State-space averaged power stage'}, ${modeText}, ${ampText}, ${comp.type}.`,
    `* Engine operating point: ${op.conduction}, D = ${op.duty.toPrecision(6)}, IL = ${op.inductorCurrent.toPrecision(6)} A.`,
    `* Loop gain T = -V(sense)/V(fb), injected by Vinj.`,
    '',
    '* --- power stage ---',
    `Vin in 0 DC ${v(cv.vin)}`,
  );
  // Nodes across the inductor L1 itself (its DCR is a separate resistor).
  let lNodes: [string, string] = ['', ''];
  const inductor = (from: string, to: string) => {
    if (cv.rl > 0) add(`Rl ${from} lx ${v(cv.rl)}`, `L1 lx ${to} ${v(cv.l)}`);
    else add(`L1 ${from} ${to} ${v(cv.l)}`);
    lNodes = [cv.rl > 0 ? 'lx' : from, to];
  };
  if (dcm) {
    // Switch network output port: i2 = ½·ipk·(t1 + t2)·fsw (buck) or ½·ipk·t2·fsw, t = L·ipk/v.
    const vOnExpr = cv.topology === 'buck' ? `(V(in)-${vMag})` : 'V(in)';
    const vOffExpr = cv.topology === 'boost' ? `(${vMag}+${v(cv.vd)}-V(in))` : `(${vMag}+${v(cv.vd)})`;
    // |ipk| in the interval lengths keeps i2 odd in ipk, so the DC solution is the positive one.
    const t1 = `(${v(cv.l)}*abs(V(ipk))/${vOnExpr})`;
    const t2 = `(${v(cv.l)}*abs(V(ipk))/${vOffExpr})`;
    const i2 = cv.topology === 'buck' ? `0.5*V(ipk)*(${t1}+${t2})*${v(cv.fsw)}` : `0.5*V(ipk)*${t2}*${v(cv.fsw)}`;
    add(inverted ? `Bi2 out 0 I = ${i2}` : `Bi2 0 out I = ${i2}`);
    if (mod.mode === 'peak-current') {
      add(`Bipk ipk 0 V = V(ctl)/(${v(mod.ri)} + ${v(mod.se * cv.l)}/${vOnExpr})`);
    } else {
      add(`Bipk ipk 0 V = ${vOnExpr}*V(duty)/${v(cv.l * cv.fsw)}`);
    }
    if (mod.mode === 'peak-current') add(`Bdutyout duty 0 V = V(ipk)*${v(cv.l * cv.fsw)}/${vOnExpr}`);
  } else if (cv.topology === 'buck') {
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
    `* --- error amplifier (${ampText}) ---`,
    `Vref ref 0 DC ${v(req.feedback.vref)}`,
  );
  if (gmStage) {
    // The divider is in the loop: its tap drives the amplifier, whose output current meets Zo at ctl.
    add(`R1 fb inv ${v(comp.r1)}`, `Rb inv 0 ${v(rb)}`, `Gamp 0 ctl ref inv ${v(comp.gm ?? 0)}`);
    if (comp.ro !== undefined && comp.ro > 0) add(`Ro ctl 0 ${v(comp.ro)}`);
    add(`R2 ctl n2 ${v(comp.r2!)}`, `C1 n2 0 ${v(comp.c1)}`);
    if ((comp.c2 ?? 0) > 0) add(`C2 ctl 0 ${v(comp.c2!)}`);
    if (comp.type === 'type3') add(`R3 fb n3 ${v(comp.r3!)}`, `C3 n3 inv ${v(comp.c3!)}`);
  } else {
    add(`R1 fb inv ${v(comp.r1)}`, `Rb inv 0 ${v(rb)}`);
    if (comp.opamp) {
      const tau = comp.opamp.a0 / (2 * Math.PI * comp.opamp.gbw);
      add(`Eamp oa 0 ref inv ${v(comp.opamp.a0)}`, 'Rpole oa ob 1', `Cpole ob 0 ${v(tau)}`, 'Eout ctl 0 ob 0 1');
    } else {
      add(`Eamp ctl 0 ref inv ${v(gainA)}`);
    }
    if (comp.type === 'type1') {
      add(`C1 inv ctl ${v(comp.c1)}`);
    } else {
      add(`R2 inv n2 ${v(comp.r2!)}`, `C1 n2 ctl ${v(comp.c1)}`);
      if ((comp.c2 ?? 0) > 0) add(`C2 inv ctl ${v(comp.c2!)}`);
      if (comp.type === 'type3') add(`R3 fb n3 ${v(comp.r3!)}`, `C3 n3 inv ${v(comp.c3!)}`);
    }
  }
  add('', '* --- modulator ---');
  if (mod.mode === 'peak-current' && !dcm) {
    const ts = 1 / cv.fsw;
    const m = control.modulator;
    const sn = m.mode === 'peak-current' ? m.sn : 0;
    const fm = 1 / ((sn + mod.se) * ts);
    const { kf, kr } = ridleyGains(cv, op.duty, mod.ri);
    add(
      `* Fm = ${v(fm)}, kf = ${v(kf)}, kr = ${v(kr)}; sampling gain He(s) on the inductor current:`,
      `Edv dv 0 ${lNodes[0]} ${lNodes[1]} 1`,
      'Cdv dv dvc 1',
      'Vdd dvc 0 0',
      `Bhe heil 0 V = I(Vls) - ${v(ts / 2 / cv.l)}*V(${lNodes[0]},${lNodes[1]}) + ${v((ts * ts) / (Math.PI * Math.PI) / cv.l)}*I(Vdd)`,
      `Bduty duty 0 V = ${v(op.duty)} + ${v(fm)}*((V(ctl)-${v(control.controlVoltage)}) - ${v(mod.ri)}*(V(heil)-${v(op.inductorCurrent)}) + ${v(kf)}*(V(in)-${v(cv.vin)}) + ${v(kr)}*(${vMag}-${v(cv.vout)}))`,
    );
  } else if (mod.mode !== 'peak-current') {
    if (dcm) {
      // The DCM high-frequency pole ω2 = 2·fsw/D2 on the duty path.
      const w2 = (2 * cv.fsw) / (op.dcmDiodeDuty ?? 1);
      add(`Edutyraw dutyraw 0 ctl 0 ${v(1 / mod.vramp)}`, 'Rw2 dutyraw duty 1', `Cw2 duty 0 ${v(1 / w2)}`);
    } else {
      add(`Eduty duty 0 ctl 0 ${v(1 / mod.vramp)}`);
    }
  }
  add(
    '',
    `.nodeset V(duty)=${v(op.duty)} V(ctl)=${v(control.controlVoltage)} V(out)=${v(sign * cv.vout)} V(inv)=${v(req.feedback.vref)}`,
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
