/**
 * Control-to-output models for each modulator and conduction mode, on top of the averaged
 * power stage of plant.ts:
 *
 * - voltage mode, CCM: Gvd/Vramp (state-space averaging, plant.ts);
 * - peak current mode, CCM: Ridley's continuous-time model (R. B. Ridley, "A new,
 *   continuous-time model for current-mode control", IEEE Trans. Power Electronics 6(2),
 *   1991). The modulator sets d̂ = Fm·[v̂c − Ri·He(s)·îL + kf·v̂g + kr·v̂], Fm = 1/((Sn + Se)·Ts),
 *   with the sampling gain He(s) = 1 + s/(ωn·Qz) + s²/ωn², ωn = π/Ts, Qz = −2/π, so
 *     Gvc = Fm·Nvd / P,  P = Δ + Fm·Ri·He·Nid − Fm·kr·Nvd
 *   over the stage's v̂/d̂ = Nvd/Δ and îL/d̂ = Nid/Δ: a third-order response with the load pole
 *   and the double pole at fsw/2 of Q = Qp = 1/(π(mc·D' − 0.5)), mc = 1 + Se/Sn.
 *   The gains kf, kr: buck kf = −(D·Ts·Ri/L)(1 − D/2), kr = Ts·Ri/(2L) as published; for
 *   the boost (kf = −Ts·Ri/(2L), kr = D'²·Ts·Ri/(2L)) and the buck-boost (kf as the buck,
 *   kr = D'²·Ts·Ri/(2L)) derived the same way: the change of the average inductor current
 *   with the slopes at a fixed peak, with the duty term written through the DC conversion
 *   ratio (this reproduces the published buck gains).
 * - DCM, either mode: the reduced-order averaged-switch model (Erickson & Maksimović,
 *   Fundamentals of Power Electronics, 2nd ed., ch. 15): the switch network's output port
 *   delivers i2(x, vg, v) to the output node, linearised as î2 = gx·x̂ + gg·v̂g + gv·v̂, so
 *     v̂/x̂ = gx·(1 + s·rc·C) / [(1/R − gv)(1 + s·rc·C) + s·C]
 *   one low-frequency pole plus the ESR zero. In voltage mode x = d and the ch. 15
 *   high-frequency pole ω2 = 2·fsw/D2 (D2 the diode interval, from memory) is added; in
 *   current mode x = vc with ipk = vc/(Ri + Se·L/vOn) (the peak reached when Ri·iL plus the
 *   ramp meets vc; Erickson & Maksimović 2nd ed. §12.3, current-programmed DCM): the
 *   inductor current has no state left at the end of a cycle, so no sampling pair appears.
 *   The inductor's DCR is neglected in DCM.
 */
import { buildPlantModel, modulatedPlant, type PlantModel } from './plant';
import { computeDcmOperatingPoint, dcmOutputCurrent, dcmPeakFromDuty } from './steady-state';
import { polyMul, type Poly } from './complex-poly';
import { multiplyTransfers, polyAdd, scaleTransfer, transferFromAnyPolys, transferFromPolys, type SectionedTransfer } from './transfer';
import type { ConverterInput, ModulatorInput, ModulatorSummary, OperatingPoint } from './types';

const TWO_PI = 2 * Math.PI;

/** The stage under its modulator, ready for the loop. */
export interface ControlPlant {
  /** The CCM averaged model of the stage (duty held). */
  model: PlantModel;
  operatingPoint: OperatingPoint;
  /** Control-to-output including the modulator (buck-boost sign-corrected). */
  plantTransfer: SectionedTransfer;
  /** Line-to-output and output impedance with the modulator input (vc or the duty) held. */
  lineToOutput: SectionedTransfer;
  outputImpedance: SectionedTransfer;
  modulator: ModulatorSummary;
  /** DCM low-frequency pole, Hz; null in CCM. */
  dcmPoleHz: number | null;
  /** DC control voltage at the modulator input (voltage mode D·Vramp; current mode vc), V. */
  controlVoltage: number;
}

/** Voltage across the inductor during the on-interval in CCM, including the DCR drop. */
const ccmOnVoltage = (cv: ConverterInput, op: OperatingPoint) =>
  cv.topology === 'buck' ? cv.vin - cv.vout - cv.rl * op.inductorCurrent : cv.vin - cv.rl * op.inductorCurrent;

/**
 * Sensed slopes and the quantities of Ridley's model at a CCM operating point:
 * Sn = Ri·vOn/L, Sf = Sn·D/D' (volt-second balance), mc = 1 + Se/Sn, Qp = 1/(π(mc·D' − 0.5)),
 * external ramp for Qp = 1 (mc·D' = 0.5 + 1/π) and for stability (mc·D' > 0.5 ⇔ Se > (Sf − Sn)/2).
 */
export const peakCurrentParameters = (cv: ConverterInput, op: OperatingPoint, ri: number, se: number) => {
  const d = op.duty;
  const dp = 1 - d;
  const sn = (ri * ccmOnVoltage(cv, op)) / cv.l;
  const sf = (sn * d) / dp;
  const mc = 1 + se / sn;
  const x = mc * dp - 0.5;
  return {
    sn,
    sf,
    mc,
    qp: x === 0 ? null : 1 / (Math.PI * x),
    seForQp1: Math.max(0, sn * ((0.5 + 1 / Math.PI) / dp - 1)),
    seMinStable: Math.max(0, (sf - sn) / 2),
  };
};

/** Ridley's feed-forward (kf, from vg) and feedback (kr, from v) gains; see the module header. */
export const ridleyGains = (cv: ConverterInput, d: number, ri: number): { kf: number; kr: number } => {
  const ts = 1 / cv.fsw;
  const dp = 1 - d;
  const base = (ts * ri) / cv.l;
  if (cv.topology === 'buck') return { kf: -base * d * (1 - d / 2), kr: base / 2 };
  if (cv.topology === 'boost') return { kf: -base / 2, kr: (base * dp * dp) / 2 };
  return { kf: -base * d * (1 - d / 2), kr: (base * dp * dp) / 2 };
};

/** Exact quotient a/b of ascending polynomials (the remainder, zero in exact arithmetic, is dropped). */
const polyDivide = (a: Poly, b: Poly): number[] => {
  let nb = b.length - 1;
  while (nb > 0 && b[nb] === 0) nb--;
  const rem = [...a];
  const nq = rem.length - 1 - nb;
  if (nq < 0) return [0];
  const q = new Array<number>(nq + 1).fill(0);
  for (let k = nq; k >= 0; k--) {
    const c = rem[k + nb] / b[nb];
    q[k] = c;
    for (let j = 0; j <= nb; j++) rem[k + j] -= c * b[j];
  }
  return q;
};

const scalePoly = (p: Poly, k: number): number[] => {
  const out: number[] = [];
  for (let i = 0; i < p.length; i++) out.push(p[i] * k);
  return out;
};

/** Ridley's peak current-mode model in CCM (module header). */
const peakCurrentCcm = (cv: ConverterInput, model: PlantModel, ri: number, se: number): Omit<ControlPlant, 'model'> => {
  const op = model.operatingPoint;
  const ts = 1 / cv.fsw;
  const p = peakCurrentParameters(cv, op, ri, se);
  const fm = 1 / ((p.sn + se) * ts);
  const { kf, kr } = ridleyGains(cv, op.duty, ri);
  const he = [1, -ts / 2, (ts * ts) / (Math.PI * Math.PI)];
  const { den, gvd, gid, gvg, gig, zout, giz } = model.polys;
  const pPoly = polyAdd(polyAdd(den, scalePoly(polyMul(he, gid), fm * ri)), scalePoly(gvd, -fm * kr));
  // v̂/û for an input u with v̂/û = Nvu/Δ, îL/û = Niu/Δ and the modulator's direct gain ku:
  // [Nvu + Fm·ku·Nvd + Fm·Ri·He·(Nvu·Nid − Nvd·Niu)/Δ] / P (the bracket's quotient is exact).
  // 1/P factored once and shared by the three responses.
  const overP = transferFromAnyPolys([1], pPoly);
  const closed = (nvu: Poly, niu: Poly, ku: number) => {
    const cross = polyDivide(polyAdd(polyMul(nvu, gid), scalePoly(polyMul(gvd, niu), -1)), den);
    const num = polyAdd(polyAdd(nvu, scalePoly(gvd, fm * ku)), scalePoly(polyMul(he, cross), fm * ri));
    return multiplyTransfers(transferFromAnyPolys(num, [1]), overP);
  };
  // DC control voltage: Ri·(average iL) plus the ramp and half the on-slope's rise at the peak.
  const controlVoltage = ri * op.inductorCurrent + (p.sn / 2) * op.duty * ts + se * op.duty * ts;
  return {
    operatingPoint: op,
    plantTransfer: multiplyTransfers(transferFromAnyPolys(scalePoly(gvd, fm), [1]), overP),
    lineToOutput: closed(gvg, gig, kf),
    outputImpedance: closed(zout, giz, 0),
    modulator: { mode: 'peak-current', ri, se, ...p, samplingPoleHz: cv.fsw / 2 },
    dcmPoleHz: null,
    controlVoltage,
  };
};

/** Central difference of f at x0, relative step 1e-5 (error of order 1e-10 for these smooth functions). */
const slope = (f: (x: number) => number, x0: number) => {
  const h = 1e-5 * Math.abs(x0);
  return (f(x0 + h) - f(x0 - h)) / (2 * h);
};

/** DCM reduced-order model (module header), either modulator. */
const dcmControl = (cv: ConverterInput, model: PlantModel, op: OperatingPoint, mod: ModulatorInput): Omit<ControlPlant, 'model'> => {
  const { topology, l, fsw, vd, vin, vout, c: cap, rc } = cv;
  const r = op.loadResistance;
  const vOn = (vg: number, v: number) => (topology === 'buck' ? vg - v : vg);
  const peakOf =
    mod.mode === 'peak-current'
      ? (x: number, vg: number, v: number) => x / (mod.ri + (mod.se * l) / vOn(vg, v))
      : (x: number, vg: number, v: number) => dcmPeakFromDuty(topology, x, vg, v, l, fsw);
  const i2 = (x: number, vg: number, v: number) => dcmOutputCurrent(topology, peakOf(x, vg, v), vg, v, vd, l, fsw);
  const x0 = mod.mode === 'peak-current' ? op.inductorPeak * (mod.ri + (mod.se * l) / vOn(vin, vout)) : op.duty;
  const gx = slope((x) => i2(x, vin, vout), x0);
  const gg = slope((vg) => i2(x0, vg, vout), vin);
  const gv = slope((v) => i2(x0, vin, v), vout);
  const y = 1 / r - gv;
  const den = [y, cap * (1 + rc * y)];
  const esr = [1, rc * cap];
  const gvx = transferFromPolys(scalePoly(esr, gx), den);
  const dcmPoleHz = y / (TWO_PI * cap * (1 + rc * y));
  if (mod.mode === 'peak-current') {
    const p = peakCurrentParameters(cv, op, mod.ri, mod.se);
    return {
      operatingPoint: op,
      plantTransfer: gvx,
      lineToOutput: transferFromPolys(scalePoly(esr, gg), den),
      outputImpedance: transferFromPolys(esr, den),
      modulator: { mode: 'peak-current', ri: mod.ri, se: mod.se, ...p, qp: null, samplingPoleHz: null, seForQp1: 0, seMinStable: 0 },
      dcmPoleHz,
      controlVoltage: x0,
    };
  }
  const w2 = (2 * fsw) / (op.dcmDiodeDuty ?? 1);
  const highPole: SectionedTransfer = { gain: 1, originOrder: 0, num: [], den: [[1, 1 / w2]] };
  return {
    operatingPoint: op,
    plantTransfer: multiplyTransfers(scaleTransfer(gvx, 1 / mod.vramp), highPole),
    lineToOutput: transferFromPolys(scalePoly(esr, gg), den),
    outputImpedance: transferFromPolys(esr, den),
    modulator: { mode: 'voltage', vramp: mod.vramp, gain: 1 / mod.vramp },
    dcmPoleHz,
    controlVoltage: op.duty * mod.vramp,
  };
};

/** The DCM high-frequency pole ω2 = 2·fsw/D2 in Hz (voltage mode only), for labels. */
export const dcmHighPoleHz = (fsw: number, d2: number) => (2 * fsw) / d2 / TWO_PI;

/**
 * The stage under its modulator at its operating point; the DCM model is chosen
 * automatically when the load is below the CCM/DCM boundary. Assumes validated input.
 */
export const buildControlPlant = (cv: ConverterInput, mod: ModulatorInput): ControlPlant => {
  const model = buildPlantModel(cv);
  const ccm = model.operatingPoint;
  if (ccm.conduction === 'DCM') {
    const dcm = computeDcmOperatingPoint(cv, ccm);
    if (dcm) return { model, ...dcmControl(cv, model, dcm, mod) };
  }
  const op: OperatingPoint = ccm.conduction === 'DCM' ? { ...ccm, conduction: 'CCM' } : ccm;
  const ccmModel = op === ccm ? model : { ...model, operatingPoint: op };
  if (mod.mode === 'peak-current') return { model: ccmModel, ...peakCurrentCcm(cv, ccmModel, mod.ri, mod.se) };
  return {
    model: ccmModel,
    operatingPoint: op,
    plantTransfer: modulatedPlant(model, mod.vramp),
    lineToOutput: model.gvg,
    outputImpedance: model.zout,
    modulator: { mode: 'voltage', vramp: mod.vramp, gain: 1 / mod.vramp },
    dcmPoleHz: null,
    controlVoltage: op.duty * mod.vramp,
  };
};
