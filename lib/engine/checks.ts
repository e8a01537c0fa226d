/**
 * Checks: warnings on a design, each { id, level, message } with a stable kebab-case id
 * (one id per concern; the level says how bad) and a message that says what is wrong and
 * what to do. Thresholds are common practice unless stated; the margin limits are
 * shared with the Tune readout (lib/catalog/margins.ts).
 *
 *   id                     level            when
 *   crossover-vs-switching caution / risk   fc > fsw/5 / fc > fsw/2
 *   crossover-vs-rhp-zero  caution / risk   fc > fRHP/3 / fc > fRHP
 *   phase-margin-low       caution / risk   PM < 45° / PM < 30°
 *   gain-margin-low        caution / risk   GM < 10 dB / GM < 6 dB
 *   multiple-crossovers    caution          more than one 0 dB crossing
 *   conditional-stability  risk             phase below −180° below fc while |T| > 0 dB
 *   crossover-above-sweep  caution / risk   |T| still above 0 dB at the sweep's end (risk when the end is at or above fsw/2)
 *   no-crossover           risk             |T| never reaches 0 dB in the sweep
 *   duty-extreme           caution          D outside 5–95 %
 *   dcm-model              note             the load is below the CCM/DCM boundary: the DCM model is in use
 *   subharmonic            risk / caution   peak current mode: mc·D' ≤ 0.5 (unstable current loop) / Qp > 2
 *   opamp-bandwidth        caution          a finite op-amp moves the placed shape by > 1 dB or 5°
 *   divider-setpoint       caution          a transconductance stage's R1/Rb do not set vout from vref
 *   part-range             note             R below 1 kΩ or above 1 MΩ, C below 10 pF
 */
import { formatSi } from '@/lib/units/si';
import { MARGIN_LIMITS } from '@/lib/catalog/margins';
import type { Check, CompensatorInput, Margins, ModulatorSummary, OperatingPoint } from './types';
import type { SampledResponse } from './margins';

const hz = (v: number) => formatSi(v, 'Hz');
/** Margins are shown to 0.1; thresholds compare the shown value, so "45.0° (under 45°)" cannot happen. */
const shown = (v: number) => Math.round(v * 10) / 10;
const deg = (v: number) => `${shown(v).toFixed(1)}°`;
const db = (v: number) => `${shown(v).toFixed(1)} dB`;
const PM = MARGIN_LIMITS.phaseMarginDeg;
const GM = MARGIN_LIMITS.gainMarginDb;

/** Checks that depend on the loop only (run on every drag). */
export const loopChecks = (args: {
  margins: Margins;
  loop: SampledResponse;
  fsw: number;
  rhpZeroHz: number | null;
  /**
   * The lowest sample frequency where the phase is below −180° while |T| > 0 dB, when the
   * caller found it while making the samples (analyze.ts); else the samples are searched.
   */
  belowMinus180Hz?: number | null;
}): Check[] => {
  const { margins, loop, fsw, rhpZeroHz } = args;
  const out: Check[] = [];
  const fc = margins.crossoverHz;
  const gainCrossings = margins.crossings.filter((c) => c.kind === 'gain');

  const n = loop.f.length;
  const endHz = n > 0 ? loop.f[n - 1] : null;
  const aboveAtEnd = n > 0 && loop.magDb[n - 1] > 0;
  if (aboveAtEnd && endHz !== null) {
    // The loop is still above 0 dB where the sweep stops: its (highest) crossover lies beyond.
    const pastHalf = endHz >= fsw / 2 * (1 - 1e-9);
    const where = pastHalf ? `above the end of the sweep (${hz(endHz)}), and so above fsw/2 (${hz(fsw / 2)})` : `above the end of the sweep (${hz(endHz)})`;
    out.push({
      id: 'crossover-above-sweep',
      level: pastHalf ? 'risk' : 'caution',
      message: pastHalf
        ? `The loop gain is still ${db(loop.magDb[n - 1])} at the end of the sweep: the crossover lies ${where}, where the averaged model no longer holds and the loop reacts to switching ripple. Lower the compensator gain (the ◆ handle) to bring fc down to about fsw/10 (${hz(fsw / 10)}).`
        : `The loop gain is still ${db(loop.magDb[n - 1])} at the end of the sweep: the crossover lies ${where}. Extend the sweep to see it, or lower the compensator gain.`,
    });
  }
  if (fc === null) {
    if (!aboveAtEnd) {
      out.push({
        id: 'no-crossover',
        level: 'risk',
        message: `The loop gain never reaches 0 dB in the sweep: there is no crossover, so the loop corrects slowly and margins cannot be read. Raise the compensator gain or extend the sweep.`,
      });
    }
  } else {
    if (fc > fsw / 2) {
      out.push({
        id: 'crossover-vs-switching',
        level: 'risk',
        message: `Crossover ${hz(fc)} is above half the switching frequency (${hz(fsw / 2)}); the averaged model no longer holds and the loop will react to switching ripple. Bring fc down to about fsw/10 (${hz(fsw / 10)}).`,
      });
    } else if (fc > fsw / 5) {
      out.push({
        id: 'crossover-vs-switching',
        level: 'caution',
        message: `Crossover ${hz(fc)} is above fsw/5 (${hz(fsw / 5)}); switching ripple and sampling delay erode the phase the averaged model shows. Aim for about fsw/10 (${hz(fsw / 10)}).`,
      });
    }
    if (rhpZeroHz !== null && fc > rhpZeroHz) {
      out.push({
        id: 'crossover-vs-rhp-zero',
        level: 'risk',
        message: `Crossover ${hz(fc)} is above the RHP zero (${hz(rhpZeroHz)}), which adds gain while taking phase away; the loop cannot be made robust there. Cross over at 1/5 to 1/3 of the RHP zero, or raise the RHP zero with a smaller inductor.`,
      });
    } else if (rhpZeroHz !== null && fc > rhpZeroHz / 3) {
      out.push({
        id: 'crossover-vs-rhp-zero',
        level: 'caution',
        message: `Crossover ${hz(fc)} is above a third of the RHP zero (${hz(rhpZeroHz)}); its phase lag grows quickly with load. Keep fc below ${hz(rhpZeroHz / 3)}, and check at maximum load and minimum input.`,
      });
    }
    const pm = margins.phaseMarginDeg === null ? null : shown(margins.phaseMarginDeg);
    if (pm !== null && pm < PM.risk) {
      out.push({
        id: 'phase-margin-low',
        level: 'risk',
        message: `Phase margin is ${deg(pm)} (under ${PM.risk}°): expect heavy ringing on load steps${pm <= 0 ? ', and the loop is unstable' : ''}. Move the compensator zeros closer to fc or lower fc; aim for ${PM.aim}.`,
      });
    } else if (pm !== null && pm < PM.caution) {
      out.push({
        id: 'phase-margin-low',
        level: 'caution',
        message: `Phase margin is ${deg(pm)} (under ${PM.caution}°): load steps will overshoot and ring. Add phase boost at fc or lower fc; aim for ${PM.aim}.`,
      });
    }
    if (gainCrossings.length > 1) {
      out.push({
        id: 'multiple-crossovers',
        level: 'caution',
        message: `The loop gain crosses 0 dB ${gainCrossings.length} times (at ${gainCrossings.map((c) => hz(c.hz)).join(', ')}); a peak near the LC resonance or a pole-zero pair is lifting the gain back up. Damp the resonance or lower the gain so there is one clean crossover.`,
      });
    }
    if (args.belowMinus180Hz !== undefined ? args.belowMinus180Hz !== null && args.belowMinus180Hz < fc : isConditionallyStable(loop, fc)) {
      out.push({
        id: 'conditional-stability',
        level: 'risk',
        message: `The phase drops below −180° below the crossover while the loop gain is still above 0 dB: the loop is only conditionally stable and can oscillate when the gain falls (soft start, low input, overload). Add phase boost near the LC resonance (zeros closer to it) so the phase stays above −180°.`,
      });
    }
  }
  const gm = margins.gainMarginDb === null ? null : shown(margins.gainMarginDb);
  if (gm !== null && gm < GM.risk) {
    out.push({
      id: 'gain-margin-low',
      level: 'risk',
      message: `Gain margin is ${db(gm)} (under ${GM.risk} dB)${gm <= 0 ? ': the loop is unstable' : ''}; part tolerances or a change of input voltage can make it oscillate. Lower the gain above fc (the compensator's gain handle) or move its poles down.`,
    });
  } else if (gm !== null && gm < GM.caution) {
    out.push({
      id: 'gain-margin-low',
      level: 'caution',
      message: `Gain margin is ${db(gm)} (under ${GM.caution} dB). Lower the gain above fc (compensator poles closer to fc) to gain headroom.`,
    });
  }
  return out;
};

/**
 * Conditional stability: the unwrapped phase below −180° at some frequency under fc where
 * |T| > 0 dB, judged on the sweep samples.
 */
const isConditionallyStable = (loop: SampledResponse, fc: number): boolean => {
  for (let i = 0; i < loop.f.length && loop.f[i] < fc; i++) {
    if (loop.phaseDeg[i] < -180 && loop.magDb[i] > 0) return true;
  }
  return false;
};

/** Checks on the power stage at its operating point. */
export const stageChecks = (op: OperatingPoint): Check[] => {
  const out: Check[] = [];
  if (op.duty < 0.05 || op.duty > 0.95) {
    out.push({
      id: 'duty-extreme',
      level: 'caution',
      message: `Duty cycle is ${(op.duty * 100).toFixed(1)} %, outside 5–95 %: minimum on- or off-times of real controllers may not allow it, and small-signal gain changes fast with D. Choose another topology, input range or switching frequency.`,
    });
  }
  return out;
};

/**
 * Checks of the modulator and conduction mode. DCM: a note that the DCM model is in use.
 * Peak current mode in CCM (Ridley 1991): mc·D' ≤ 0.5 puts the double pole at fsw/2 in the
 * right half plane (subharmonic oscillation of the current loop: risk); Qp > 2 leaves it
 * lightly damped (caution; Qp near 1 is the usual aim, common practice).
 */
export const modulatorChecks = (op: OperatingPoint, mod: ModulatorSummary, dcmPoleHz: number | null): Check[] => {
  const out: Check[] = [];
  if (op.conduction === 'DCM') {
    out.push({
      id: 'dcm-model',
      level: 'note',
      message: `At this load the inductor current falls to zero each cycle (DCM: D = ${(op.duty * 100).toFixed(1)} %, diode interval ${((op.dcmDiodeDuty ?? 0) * 100).toFixed(1)} %), so the loop is drawn with the DCM averaged model: one low-frequency pole${dcmPoleHz !== null ? ` at ${hz(dcmPoleHz)}` : ''} instead of the LC double pole. Above ${formatSi(op.criticalLoadCurrent, 'A')} the stage is in CCM; check the loop at full load too.`,
    });
  }
  if (mod.mode === 'peak-current' && op.conduction === 'CCM') {
    const x = mod.mc * op.dutyComplement;
    const slope = (v: number) => formatSi(v, 'V/s');
    if (x <= 0.5) {
      out.push({
        id: 'subharmonic',
        level: 'risk',
        message: `The current loop is unstable at D = ${(op.duty * 100).toFixed(1)} %: mc·D' = ${x.toFixed(3)} is not above 0.5, so the sampling double pole at ${hz(mod.samplingPoleHz ?? 0)} lies in the right half plane (subharmonic oscillation). Raise the external ramp Se above ${slope(mod.seMinStable)}; ${slope(mod.seForQp1)} gives Qp = 1.`,
      });
    } else if (mod.qp !== null && mod.qp > 2) {
      out.push({
        id: 'subharmonic',
        level: 'caution',
        message: `Qp = ${mod.qp.toFixed(2)} (above 2): the double pole at ${hz(mod.samplingPoleHz ?? 0)} peaks sharply and the current loop rings near fsw/2 at this duty. An external ramp of ${slope(mod.seForQp1)} gives Qp = 1.`,
      });
    }
  }
  return out;
};

/** Practical part ranges: R 1 kΩ…1 MΩ, C ≥ 10 pF (op-amp input currents, parasitics). */
export const partChecks = (comp: CompensatorInput, rb: number | null): Check[] => {
  const resistors: [string, number | undefined][] = [
    ['R1', comp.r1],
    ['R2', comp.type === 'type1' ? undefined : comp.r2],
    ['R3', comp.type === 'type3' ? comp.r3 : undefined],
    ['Rb', rb ?? undefined],
  ];
  const capacitors: [string, number | undefined][] = [
    ['C1', comp.c1],
    ['C2', comp.type === 'type1' ? undefined : comp.c2],
    ['C3', comp.type === 'type3' ? comp.c3 : undefined],
  ];
  const problems: string[] = [];
  for (const [name, v] of resistors) {
    if (v === undefined || !(v > 0)) continue;
    if (v < 1e3) problems.push(`${name} = ${formatSi(v, 'Ω')} is below 1 kΩ (loads the op-amp output and the rail)`);
    if (v > 1e6) problems.push(`${name} = ${formatSi(v, 'Ω')} is above 1 MΩ (noise and op-amp bias current)`);
  }
  for (const [name, v] of capacitors) {
    if (v === undefined || !(v > 0)) continue;
    if (v < 10e-12) problems.push(`${name} = ${formatSi(v, 'F')} is below 10 pF (board parasitics of that size shift it)`);
  }
  if (problems.length === 0) return [];
  return [
    {
      id: 'part-range',
      level: 'note',
      message: `${problems.join('; ')}. Change R1 and let the other parts scale with it, keeping the same poles and zeros.`,
    },
  ];
};

/**
 * Amplifier checks. opamp-bandwidth: a finite op-amp (single pole, a0 and GBW) moves the
 * placed shape by more than 1 dB or 5° at fc or at a placed pole below fsw/2 (the inverting
 * stage's gain falls where the noise gain 1 + |Zf/Zi| meets |A|; Sedra & Smith, ch. 2).
 * divider-setpoint: with a transconductance amplifier R1 and Rb are given, and vout·Rb/(R1+Rb)
 * should equal vref (within 1 %).
 */
export const amplifierChecks = (args: {
  comp: CompensatorInput;
  shapeError: { worstDb: number; worstDeg: number; atHz: number | null } | null;
  gbwEnoughHz: number | null;
  vref: number;
  vout: number;
}): Check[] => {
  const out: Check[] = [];
  const { comp, shapeError } = args;
  if (shapeError && comp.opamp && (shapeError.worstDb > 1 || shapeError.worstDeg > 5)) {
    out.push({
      id: 'opamp-bandwidth',
      level: 'caution',
      message: `The op-amp (a0 ${comp.opamp.a0.toPrecision(3)}, GBW ${hz(comp.opamp.gbw)}) bends the placed compensator by up to ${db(shapeError.worstDb)} and ${deg(shapeError.worstDeg)}${shapeError.atHz !== null ? ` (near ${hz(shapeError.atHz)})` : ''}: the loop drawn includes it, but the poles and zeros are no longer where the handles put them. ${args.gbwEnoughHz !== null ? `A GBW of about ${hz(args.gbwEnoughHz)} would keep within 1 dB and 5°.` : 'Even a much faster op-amp would not: its DC gain a0 is the limit; use one with more gain.'}`,
    });
  }
  if (comp.amplifier === 'transconductance' && comp.rb !== undefined && comp.rb > 0) {
    const set = (Math.abs(args.vout) * comp.rb) / (comp.r1 + comp.rb);
    if (Math.abs(set - args.vref) > 0.01 * args.vref) {
      out.push({
        id: 'divider-setpoint',
        level: 'caution',
        message: `R1 and Rb divide ${formatSi(Math.abs(args.vout), 'V')} to ${formatSi(set, 'V')}, not to vref ${formatSi(args.vref, 'V')}: the output would settle at ${formatSi((args.vref * (comp.r1 + comp.rb)) / comp.rb, 'V')}. Rb = ${formatSi((comp.r1 * args.vref) / (Math.abs(args.vout) - args.vref), 'Ω')} sets it.`,
      });
    }
  }
  return out;
};
