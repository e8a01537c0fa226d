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
    dcmDiodeDuty: null,
    criticalInductance,
    criticalLoadCurrent,
  };
};

/** Voltage across the inductor while the switch is on (DCM model: the inductor DCR is neglected). */
const dcmOnVoltage = (topology: ConverterInput['topology'], vin: number, v: number) => (topology === 'buck' ? vin - v : vin);
/** Voltage across the inductor while the diode conducts (magnitude). */
const dcmOffVoltage = (topology: ConverterInput['topology'], vin: number, v: number, vd: number) =>
  topology === 'boost' ? v + vd - vin : v + vd;

/**
 * Average current delivered to the output node in DCM for a peak inductor current ipk:
 * the inductor rises for t1 = L·ipk/vOn and falls for t2 = L·ipk/vOff, then rests at zero.
 * Buck: the inductor feeds the output in both intervals, i2 = ½·ipk·(t1 + t2)·fsw;
 * boost and buck-boost: in the second only, i2 = ½·ipk·t2·fsw. This is the averaged
 * switch network of Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed.,
 * ch. 15 (its output port), written with the inductor current's peak as the variable.
 */
export const dcmOutputCurrent = (
  topology: ConverterInput['topology'],
  ipk: number,
  vin: number,
  v: number,
  vd: number,
  l: number,
  fsw: number,
): number => {
  const t1 = (l * ipk) / dcmOnVoltage(topology, vin, v);
  const t2 = (l * ipk) / dcmOffVoltage(topology, vin, v, vd);
  return topology === 'buck' ? 0.5 * ipk * (t1 + t2) * fsw : 0.5 * ipk * t2 * fsw;
};

/** Peak current for a voltage-mode duty d in DCM: ipk = vOn·d/(L·fsw). */
export const dcmPeakFromDuty = (topology: ConverterInput['topology'], d: number, vin: number, v: number, l: number, fsw: number) =>
  (dcmOnVoltage(topology, vin, v) * d) / (l * fsw);

/**
 * DCM steady state (Erickson & Maksimović 2nd ed. ch. 15: the load draws what the switch
 * network's output port delivers). i2 grows with ipk², so ipk = √(Iout / i2(ipk = 1)); then
 * D = L·ipk·fsw/vOn and D2 = L·ipk·fsw/vOff. Returns null when D + D2 ≥ 1 (the stage is in
 * CCM after all, which the lossy CCM boundary can leave near the edge).
 */
export const computeDcmOperatingPoint = (c: ConverterInput, ccm: OperatingPoint): OperatingPoint | null => {
  const { topology, vin, vout, iout, l, fsw, vd } = c;
  const vOn = dcmOnVoltage(topology, vin, vout);
  const vOff = dcmOffVoltage(topology, vin, vout, vd);
  if (!(vOn > 0) || !(vOff > 0)) return null;
  const ipk = Math.sqrt(iout / dcmOutputCurrent(topology, 1, vin, vout, vd, l, fsw));
  const duty = (l * ipk * fsw) / vOn;
  const d2 = (l * ipk * fsw) / vOff;
  if (duty + d2 >= 1) return null;
  const inductorCurrent = 0.5 * ipk * (duty + d2);
  const isBuck = topology === 'buck';
  // Capacitor ripple: buck, the charge above the mean of the inductor current's triangle;
  // boost and buck-boost, the load carried alone outside the diode interval.
  const outputRippleCapPp = isBuck
    ? (Math.pow(ipk - iout, 2) * (duty + d2)) / (2 * ipk * c.c * fsw)
    : (iout * (1 - d2)) / (c.c * fsw);
  const outputRippleEsrPp = c.rc * ipk;
  return {
    ...ccm,
    duty,
    dutyComplement: 1 - duty,
    inductorCurrent,
    inductorRipplePp: ipk,
    inductorPeak: ipk,
    outputRipplePp: outputRippleCapPp + outputRippleEsrPp,
    outputRippleCapPp,
    outputRippleEsrPp,
    conduction: 'DCM',
    dcmDiodeDuty: d2,
  };
};
