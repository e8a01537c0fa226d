/**
 * Small-signal averaged models of the power stage by state-space averaging (Middlebrook & Ćuk).
 *
 * States x = [iL, vC], inputs u = [vg, vd] (vd: diode drop as a constant source), output
 * y = v (the output magnitude; for the inverting buck-boost the model is written for |v|,
 * so its Gvd is already the sign-corrected −Gvd of the negative output).
 *
 * In each switching interval the inductor sees  L·diL/dt = ag·vg − ad·vd − rl·iL − b·v  and
 * the output network R ∥ (rc + C) is fed by b·iL (b = 1 when the inductor is connected to
 * the output), so  v = kR·vC + Rp·b·iL,  C·dvC/dt = (R·b·iL − vC)/(R + rc),
 * with kR = R/(R + rc), Rp = R·rc/(R + rc).
 *
 *   interval   buck on/off   boost on/off   buck-boost on/off
 *   ag         1 / 0         1 / 1          1 / 0
 *   ad         0 / 1         0 / 1          0 / 1
 *   b          1 / 1         0 / 1          0 / 1
 *
 * Averaging A = D·A_on + D'·A_off (likewise B, C) and perturbing d gives, for a 2-state model,
 * G(s) = [c·adj(sI − A)·b + e·det(sI − A)] / det(sI − A), a ratio of quadratics whose roots
 * are the exact poles and zeros of the lossy model (ESR zero, RHP zero, LC pair).
 */
import { computeOperatingPoint } from './steady-state';
import { summarizeTransfer, transferFromPolys, scaleTransfer, type SectionedTransfer } from './transfer';
import type { ConverterInput, OperatingPoint, Topology, TransferSummary } from './types';

type Vec2 = [number, number];
type Mat2 = [[number, number], [number, number]];

/** How each switching interval connects the inductor (the table in the module header). */
export interface Interval {
  ag: number;
  ad: number;
  b: number;
}

/** The on and off intervals of each topology; the switching simulation uses the same table. */
export const INTERVALS: Readonly<Record<Topology, { on: Interval; off: Interval }>> = {
  buck: { on: { ag: 1, ad: 0, b: 1 }, off: { ag: 0, ad: 1, b: 1 } },
  boost: { on: { ag: 1, ad: 0, b: 0 }, off: { ag: 1, ad: 1, b: 1 } },
  'buck-boost': { on: { ag: 1, ad: 0, b: 0 }, off: { ag: 0, ad: 1, b: 1 } },
};

interface StateSpace {
  a: Mat2;
  /** Columns for vg and vd. */
  bg: Vec2;
  bd: Vec2;
  /** Column for a current injected into the output node (for Zout), and its feedthrough. */
  bz: Vec2;
  ez: number;
  /** Output row v = c·x. */
  c: Vec2;
}

const intervalModel = (cv: ConverterInput, r: number, iv: Interval): StateSpace => {
  const { l, c: cap, rl, rc } = cv;
  const kR = r / (r + rc);
  const rp = (r * rc) / (r + rc);
  return {
    a: [
      [-(rl + iv.b * rp) / l, (-iv.b * kR) / l],
      [(iv.b * kR) / cap, -1 / ((r + rc) * cap)],
    ],
    bg: [iv.ag / l, 0],
    bd: [-iv.ad / l, 0],
    bz: [(-iv.b * rp) / l, kR / cap],
    ez: rp,
    c: [iv.b * rp, kR],
  };
};

const mix = (x: number, y: number, d: number) => d * x + (1 - d) * y;
const mixVec = (x: Vec2, y: Vec2, d: number): Vec2 => [mix(x[0], y[0], d), mix(x[1], y[1], d)];
const mixMat = (x: Mat2, y: Mat2, d: number): Mat2 => [mixVec(x[0], y[0], d), mixVec(x[1], y[1], d)];
const matVec = (m: Mat2, v: Vec2): Vec2 => [m[0][0] * v[0] + m[0][1] * v[1], m[1][0] * v[0] + m[1][1] * v[1]];
const sub = (x: Vec2, y: Vec2): Vec2 => [x[0] - y[0], x[1] - y[1]];
const dot = (x: Vec2, y: Vec2) => x[0] * y[0] + x[1] * y[1];

/**
 * Transfer from an input column bIn (and feedthrough e) to y = c·x for x' = A·x + bIn·u:
 * numerator c·adj(sI − A)·bIn + e·det(sI − A), denominator det(sI − A) = s² − tr(A)·s + det(A).
 * Ascending coefficients.
 */
const transferOf = (a: Mat2, bIn: Vec2, c: Vec2, e: number) => {
  // Indexed rather than destructured: seven of these per model, on every analysis.
  const a11 = a[0][0];
  const a12 = a[0][1];
  const a21 = a[1][0];
  const a22 = a[1][1];
  const tr = a11 + a22;
  const det = a11 * a22 - a12 * a21;
  const c1 = c[0];
  const c2 = c[1];
  const b1 = bIn[0];
  const b2 = bIn[1];
  const num = [
    -c1 * a22 * b1 + c1 * a12 * b2 + c2 * a21 * b1 - c2 * a11 * b2 + e * det,
    c1 * b1 + c2 * b2 - e * tr,
    e,
  ];
  return { num, den: [det, -tr, 1] };
};

export interface PlantModel {
  operatingPoint: OperatingPoint;
  /** DC states of the averaged model: [IL, VC]. */
  states: Vec2;
  /** Output magnitude of the averaged DC model (equals vout; kept for checks). */
  vOutModel: number;
  /** Control-to-output v̂/d̂ (buck-boost: of |v|, i.e. sign-corrected). */
  gvd: SectionedTransfer;
  /** Line-to-output v̂/v̂g (buck-boost: of |v|). */
  gvg: SectionedTransfer;
  /** Output impedance v̂/î for a current injected into the output node, Ω. */
  zout: SectionedTransfer;
  /**
   * The raw polynomials (ascending) over the common denominator det(sI − A): v̂/d̂ and
   * îL/d̂ numerators, for models that close a loop around them (peak current mode).
   */
  polys: { den: number[]; gvd: number[]; gid: number[]; gvg: number[]; gig: number[]; zout: number[]; giz: number[] };
}

/**
 * Build the averaged small-signal model at the CCM operating point.
 * Assumes validated input (see validate.ts).
 */
export const buildPlantModel = (cv: ConverterInput): PlantModel => {
  const op = computeOperatingPoint(cv);
  const d = op.duty;
  const r = op.loadResistance;
  const iv = INTERVALS[cv.topology];
  const on = intervalModel(cv, r, iv.on);
  const off = intervalModel(cv, r, iv.off);
  const a = mixMat(on.a, off.a, d);
  const bg = mixVec(on.bg, off.bg, d);
  const bd = mixVec(on.bd, off.bd, d);
  const c = mixVec(on.c, off.c, d);
  const bz = mixVec(on.bz, off.bz, d);
  const ez = mix(on.ez, off.ez, d);
  // DC: 0 = A·X + bg·Vg + bd·Vd  →  X = −A⁻¹·(bg·Vg + bd·Vd)
  const u: Vec2 = [bg[0] * cv.vin + bd[0] * cv.vd, bg[1] * cv.vin + bd[1] * cv.vd];
  const det = a[0][0] * a[1][1] - a[0][1] * a[1][0];
  const x: Vec2 = [-(a[1][1] * u[0] - a[0][1] * u[1]) / det, -(-a[1][0] * u[0] + a[0][0] * u[1]) / det];
  // Duty perturbation: bDuty = (A_on − A_off)·X + (B_on − B_off)·U, eDuty = (c_on − c_off)·X
  const dA: Mat2 = [sub(on.a[0], off.a[0]), sub(on.a[1], off.a[1])];
  const bDuty: Vec2 = matVec(dA, x);
  bDuty[0] += (on.bg[0] - off.bg[0]) * cv.vin + (on.bd[0] - off.bd[0]) * cv.vd;
  bDuty[1] += (on.bg[1] - off.bg[1]) * cv.vin + (on.bd[1] - off.bd[1]) * cv.vd;
  const eDuty = dot(sub(on.c, off.c), x);
  const gvdP = transferOf(a, bDuty, c, eDuty);
  const gvgP = transferOf(a, bg, c, 0);
  const zoutP = transferOf(a, bz, c, ez);
  const gidP = transferOf(a, bDuty, [1, 0], 0);
  return {
    polys: {
      den: gvdP.den,
      gvd: gvdP.num,
      gid: gidP.num,
      gvg: gvgP.num,
      gig: transferOf(a, bg, [1, 0], 0).num,
      zout: zoutP.num,
      giz: transferOf(a, bz, [1, 0], 0).num,
    },
    operatingPoint: op,
    states: x,
    vOutModel: dot(c, x),
    gvd: transferFromPolys(gvdP.num, gvdP.den),
    gvg: transferFromPolys(gvgP.num, gvgP.den),
    zout: transferFromPolys(zoutP.num, zoutP.den),
  };
};

/** ESR zero 1/(2π·rc·C) in Hz, or null without ESR. */
export const esrZeroHint = (cv: ConverterInput): number | null => (cv.rc > 0 ? 1 / (2 * Math.PI * cv.rc * cv.c) : null);

/**
 * Control-to-output including the PWM modulator: Gvd/Vramp (buck-boost sign-corrected so the
 * DC gain is positive for every topology). This is the plant of the loop T = Gc·Gvd/Vramp.
 */
export const modulatedPlant = (model: PlantModel, vramp: number): SectionedTransfer => scaleTransfer(model.gvd, 1 / vramp);

/** Summaries of the three power-stage transfers; `plant` includes 1/Vramp. */
export const summarizePlant = (
  model: PlantModel,
  cv: ConverterInput,
  vramp: number,
): { plant: TransferSummary; lineToOutput: TransferSummary; outputImpedance: TransferSummary } => {
  const hint = esrZeroHint(cv);
  return {
    plant: summarizeTransfer(modulatedPlant(model, vramp), hint),
    lineToOutput: summarizeTransfer(model.gvg, hint),
    outputImpedance: summarizeTransfer(model.zout, hint),
  };
};
