/**
 * DC operating point of buck, boost and inverting buck-boost in CCM, from the same averaged
 * model as the small-signal transfers (plant.ts): inductor DCR rl, diode drop vd (0 =
 * synchronous) and capacitor ESR rc. Volt-second balance on the inductor, with
 * IL = Iout (buck) or Iout/D' (boost, buck-boost), kR = R/(R + rc), Rp = R·rc/(R + rc):
 *
 *   buck:        D = (V + vd + rl·I) / (Vg + vd)
 *   boost:       (vd + kR·V)·D'² − (Vg − Rp·I)·D' + rl·I = 0
 *   buck-boost:  (Vg + vd + kR·V)·D'² − (Vg − Rp·I)·D' + rl·I = 0
 *
 * The ESR has no DC effect on the buck. In the boost and buck-boost the inductor sees the
 * output only while it feeds it, when the capacitor charges through its ESR, so the
 * off-interval output is kR·V + Rp·IL; state-space averaging keeps that term (it vanishes
 * for rc = 0). For the quadratics the larger D' (lower, physical D) is taken; the other root
 * is the high-duty branch past the peak of M(D). V is the output magnitude (the buck-boost
 * output is negative).
 */
import { EngineInputError, type ConverterInput, type OperatingPoint } from './types';

/** The stage with rl, rc, vd defaulted to 0 (the schema applies them too; the engine may be called directly). */
export const withLossDefaults = (c: ConverterInput): ConverterInput => ({ ...c, rl: c.rl ?? 0, rc: c.rc ?? 0, vd: c.vd ?? 0 });

/**
 * Duty cycle D (0…1) of the averaged DC model.
 * @throws EngineInputError when the output cannot be reached (duty ≥ 1, no real root).
 */
export const computeDuty = (c: ConverterInput): number => {
  const { vin, vout, iout, rl, vd } = c;
  if (c.topology === 'buck') {
    const d = (vout + vd + rl * iout) / (vin + vd);
    if (d >= 1) {
      throw new EngineInputError([
        {
          path: 'converter.vout',
          message: `a buck cannot make ${vout} V from ${vin} V with these losses (duty would be ${(d * 100).toFixed(1)} %); lower vout or raise vin`,
        },
      ]);
    }
    return d;
  }
  const r = vout / iout;
  const kR = r / (r + c.rc);
  const rp = (r * c.rc) / (r + c.rc);
  const a = c.topology === 'boost' ? vd + kR * vout : vin + vd + kR * vout;
  const b = vin - rp * iout;
  const disc = b * b - 4 * a * rl * iout;
  if (disc < 0) {
    throw new EngineInputError([
      {
        path: 'converter.vout',
        message: `${vout} V at ${iout} A is beyond the reach of this ${c.topology} with rl = ${rl} Ω and rc = ${c.rc} Ω (the losses cap the conversion ratio); lower vout, iout, rl or rc`,
      },
    ]);
  }
  const dPrime = (b + Math.sqrt(disc)) / (2 * a);
  const d = 1 - dPrime;
  if (d <= 0 || d >= 1) {
    throw new EngineInputError([
      { path: 'converter.vout', message: `duty cycle ${(d * 100).toFixed(1)} % is outside 0–100 %; check vin and vout` },
    ]);
  }
  return d;
};

/**
 * Operating point: duty, load, average and peak inductor current, ripples and the CCM/DCM
 * boundary.
 * - ΔiL (p-p) = (voltage across L during the on-interval)·D/(L·fsw):
 *   buck Vg − V − rl·IL, boost and buck-boost Vg − rl·IL.
 * - Output ripple, capacitive part: buck ΔiL/(8·C·fsw); boost, buck-boost Iout·D/(C·fsw).
 *   ESR part: buck rc·ΔiL; boost, buck-boost rc·(IL + ΔiL/2) (the step of capacitor current
 *   at turn-off). Total = sum of both (an upper bound: the two parts peak at different times).
 * - DCM when ΔiL/2 > IL. Critical inductance L·ΔiL/(2·IL); critical load current ΔiL/2
 *   (buck) or D'·ΔiL/2 (boost, buck-boost), ripple taken at this duty.
 */
export const computeOperatingPoint = (c: ConverterInput): OperatingPoint => {
  const duty = computeDuty(c);
  const dPrime = 1 - duty;
  const loadResistance = c.vout / c.iout;
  const isBuck = c.topology === 'buck';
  const inductorCurrent = isBuck ? c.iout : c.iout / dPrime;
  const vOn = isBuck ? c.vin - c.vout - c.rl * inductorCurrent : c.vin - c.rl * inductorCurrent;
  const inductorRipplePp = (vOn * duty) / (c.l * c.fsw);
  const inductorPeak = inductorCurrent + inductorRipplePp / 2;
  const outputRippleCapPp = isBuck
    ? inductorRipplePp / (8 * c.c * c.fsw)
    : (c.iout * duty) / (c.c * c.fsw);
  const outputRippleEsrPp = isBuck ? c.rc * inductorRipplePp : c.rc * inductorPeak;
  const criticalInductance = (c.l * inductorRipplePp) / (2 * inductorCurrent);
  const criticalLoadCurrent = isBuck ? inductorRipplePp / 2 : (dPrime * inductorRipplePp) / 2;
  return {
    duty,
    dutyComplement: dPrime,
    loadResistance,
    inductorCurrent,
    inductorRipplePp,
    inductorPeak,
    outputRipplePp: outputRippleCapPp + outputRippleEsrPp,
    outputRippleCapPp,
    outputRippleEsrPp,
    conduction: inductorRipplePp / 2 > inductorCurrent ? 'DCM' : 'CCM',
    criticalInductance,
    criticalLoadCurrent,
  };
};
