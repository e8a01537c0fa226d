/**
 * Time response of the whole linear (averaged, small-signal) loop: the power stage's three
 * transfers — control-to-output, line-to-output, output impedance — and the compensator,
 * each realized in state space (state-space.ts) and closed around the output:
 *
 *   v  = P·vc + Gvg·v̂g + Zout·î          (î: current injected into the output node)
 *   vc = Gc·(r − v)                       (r: reference, scaled to the output)
 *
 * so that v/î = Zout/(1+T), v/v̂g = Gvg/(1+T), v/r = T/(1+T) with T = Gc·P (Erickson &
 * Maksimović, Fundamentals of Power Electronics, 2nd ed., ch. 9). Inputs are states of an
 * augmented system z = [x; v̂g; î; r; 1] whose slopes are constant while an input slews and
 * zero afterwards, so each time step is exact: z(t + Δt) = e^{MΔt}·z(t) (no numerical
 * integration error beyond the matrix exponential's rounding).
 *
 * Works on transfers only, so every control mode whose averaged model gives these four
 * transfers is simulated the same way.
 */
import { expm, matVec, solveInPlace } from './matrix-exp';
import { balance, realizeTransfer, type StateSpace } from './state-space';
import type { SectionedTransfer } from './transfer';

export interface LoopBlocks {
  /** Control-to-output, including the modulator (the plant of T). */
  control: SectionedTransfer;
  /** Open-loop line-to-output. */
  line: SectionedTransfer;
  /** Open-loop output impedance for a current injected into the output node, Ω. */
  zout: SectionedTransfer;
  /** Compensator Gc (T = Gc·control). */
  compensator: SectionedTransfer;
}

export type LoopInput = 'line' | 'load' | 'reference';

export interface LoopStepInput {
  input: LoopInput;
  /**
   * Size of the step: V of input change (line), A of load increase (load; injected current
   * is its negative), V of output set point (reference).
   */
  amplitude: number;
  /** Rate of change, units per second; null = ideal step. */
  slewPerS: number | null;
  /** Simulated time after the step, s. */
  durationS: number;
  /** Samples after the step (the step instant t = 0 included). */
  points: number;
}

export interface LoopTimeResponse {
  /** Times, s (0 = start of the step). */
  t: number[];
  /** Output deviation v̂, V. */
  v: number[];
  /** Control deviation v̂c (compensator output), V. */
  vc: number[];
  /** Final output deviation (closed-loop DC response to the final input), V. */
  vFinal: number;
}

/** The closed loop as one augmented system; see the module header. */
interface AssembledLoop {
  size: number;
  nx: number;
  /** Matrices with inputs held (M_hold) and with the slewing input moving at 1 unit/s per `slope` (M_ramp). */
  hold: Float64Array;
  ramp: Float64Array;
  vRow: Float64Array;
  vcRow: Float64Array;
}

const INPUT_INDEX: Record<LoopInput, number> = { line: 0, load: 1, reference: 2 };

const assemble = (blocks: LoopBlocks, input: LoopInput, slope: number): AssembledLoop => {
  const p = realizeTransfer(blocks.control);
  const g = realizeTransfer(blocks.line);
  const z = realizeTransfer(blocks.zout);
  const c = realizeTransfer(blocks.compensator);
  const oP = 0;
  const oG = oP + p.n;
  const oZ = oG + g.n;
  const oC = oZ + z.n;
  const nx = oC + c.n;
  const uLine = nx;
  const uInj = nx + 1;
  const uRef = nx + 2;
  const one = nx + 3;
  const size = nx + 4;
  // v = k·(cP·xP + cG·xG + cZ·xZ + dP·cC·xC + dG·v̂g + dZ·î + dP·dC·r), k = 1/(1 + dP·dC)
  const k = 1 / (1 + p.d * c.d);
  const vRow = new Float64Array(size);
  for (let i = 0; i < p.n; i++) vRow[oP + i] = k * p.c[i];
  for (let i = 0; i < g.n; i++) vRow[oG + i] = k * g.c[i];
  for (let i = 0; i < z.n; i++) vRow[oZ + i] = k * z.c[i];
  for (let i = 0; i < c.n; i++) vRow[oC + i] = k * p.d * c.c[i];
  vRow[uLine] = k * g.d;
  vRow[uInj] = k * z.d;
  vRow[uRef] = k * p.d * c.d;
  // vc = cC·xC + dC·(r − v)
  const vcRow = new Float64Array(size);
  for (let j = 0; j < size; j++) vcRow[j] = -c.d * vRow[j];
  for (let i = 0; i < c.n; i++) vcRow[oC + i] += c.c[i];
  vcRow[uRef] += c.d;
  const hold = new Float64Array(size * size);
  const block = (ss: StateSpace, o: number) => {
    for (let i = 0; i < ss.n; i++) for (let j = 0; j < ss.n; j++) hold[(o + i) * size + o + j] = ss.a[i * ss.n + j];
  };
  block(p, oP);
  block(g, oG);
  block(z, oZ);
  block(c, oC);
  for (let i = 0; i < p.n; i++) for (let j = 0; j < size; j++) hold[(oP + i) * size + j] += p.b[i] * vcRow[j];
  for (let i = 0; i < g.n; i++) hold[(oG + i) * size + uLine] += g.b[i];
  for (let i = 0; i < z.n; i++) hold[(oZ + i) * size + uInj] += z.b[i];
  for (let i = 0; i < c.n; i++) {
    for (let j = 0; j < size; j++) hold[(oC + i) * size + j] -= c.b[i] * vRow[j];
    hold[(oC + i) * size + uRef] += c.b[i];
  }
  const ramp = hold.slice();
  ramp[(nx + INPUT_INDEX[input]) * size + one] = slope;
  return { size, nx, hold, ramp, vRow, vcRow };
};

/** e^{M·t} computed on the balanced matrix and scaled back (Φ = D·e^{D⁻¹MD·t}·D⁻¹). */
const transition = (m: Float64Array, n: number, t: number): Float64Array => {
  const b = m.slice();
  const d = balance(b, n);
  const e = expm(b, n, t);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) e[i * n + j] *= d[i] / d[j];
  return e;
};

const dotRow = (row: Float64Array, z: Float64Array) => {
  let s = 0;
  for (let i = 0; i < row.length; i++) s += row[i] * z[i];
  return s;
};

/** Closed-loop final state x∞ = −A⁻¹·B·u for the inputs held in z (A: the nx×nx loop block). */
const finalOutput = (loop: AssembledLoop, z: Float64Array): number => {
  const { nx, size, hold } = loop;
  if (nx === 0) return dotRow(loop.vRow, z);
  const a = new Float64Array(nx * nx);
  const rhs = new Float64Array(nx * nx);
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < nx; j++) a[i * nx + j] = hold[i * size + j];
    let s = 0;
    for (let j = nx; j < size; j++) s += hold[i * size + j] * z[j];
    rhs[i * nx] = -s;
  }
  const x = solveInPlace(a, rhs, nx);
  const zf = z.slice();
  for (let i = 0; i < nx; i++) zf[i] = x[i * nx];
  return dotRow(loop.vRow, zf);
};

/**
 * Step (or ramp-then-hold) response of the closed loop from zero initial deviation.
 * The slew end falls between samples in general; that step is split there, so the ramp is
 * exact too.
 */
export const simulateLoopStep = (blocks: LoopBlocks, s: LoopStepInput): LoopTimeResponse => {
  const slewing = s.slewPerS !== null && s.slewPerS > 0;
  const sign = s.input === 'load' ? -1 : 1; // a load increase draws current out of the output node
  const target = sign * s.amplitude;
  const slope = slewing ? Math.sign(target) * s.slewPerS! : 0;
  const loop = assemble(blocks, s.input, slope);
  const n = loop.size;
  const idx = loop.nx + INPUT_INDEX[s.input];
  const rampEnd = slewing ? Math.abs(target) / s.slewPerS! : 0;
  const points = Math.max(2, Math.round(s.points));
  const dt = s.durationS / (points - 1);
  const phiHold = transition(loop.hold, n, dt);
  const phiRamp = slewing ? transition(loop.ramp, n, dt) : phiHold;
  let z = new Float64Array(n);
  z[n - 1] = 1;
  if (!slewing) z[idx] = target;
  const t: number[] = new Array(points);
  const v: number[] = new Array(points);
  const vc: number[] = new Array(points);
  const next = new Float64Array(n);
  for (let i = 0; i < points; i++) {
    t[i] = i * dt;
    v[i] = dotRow(loop.vRow, z);
    vc[i] = dotRow(loop.vcRow, z);
    if (i === points - 1) break;
    const t0 = i * dt;
    const t1 = t0 + dt;
    if (slewing && t0 < rampEnd && t1 > rampEnd) {
      // Split at the end of the slew: ramp to it, then hold.
      const a = rampEnd - t0;
      z = new Float64Array(matVec(transition(loop.ramp, n, a), z, n));
      z[idx] = target;
      z = new Float64Array(matVec(transition(loop.hold, n, t1 - rampEnd), z, n));
    } else {
      matVec(slewing && t1 <= rampEnd ? phiRamp : phiHold, z, n, next);
      z.set(next);
      if (slewing && t1 === rampEnd) z[idx] = target;
    }
  }
  const zf = new Float64Array(n);
  zf[idx] = target;
  zf[n - 1] = 1;
  return { t, v, vc, vFinal: finalOutput(loop, zf) };
};

export interface StepMetrics {
  /** Largest deviation from the value before the step, signed, V. */
  peakDeviation: number;
  /** Time of that peak, s after the step. */
  peakTimeS: number;
  /** Largest excursion past the final value on the far side of the first peak, V (≥ 0). */
  overshoot: number;
  /** overshoot relative to the final change; null when the output returns to where it was (load, line). */
  overshootFraction: number | null;
  /** Last time the deviation from the final value leaves ±bandV, s; 0 if never; null if not settled by the end. */
  settlingTime: number | null;
}

/**
 * Metrics of a response y(t) starting at deviation 0 with final value yFinal.
 * The overshoot is measured beyond the final value in the direction of travel for a set-point
 * change (Ogata, Modern Control Engineering, ch. 5: Mp = (y_peak − y∞)/y∞); for a disturbance
 * that the integrator rejects (y∞ ≈ 0) it is the rebound past y∞ opposite to the first peak.
 */
export const stepMetrics = (t: readonly number[], y: readonly number[], yFinal: number, bandV: number): StepMetrics => {
  let peakIdx = 0;
  for (let i = 1; i < y.length; i++) if (Math.abs(y[i]) > Math.abs(y[peakIdx])) peakIdx = i;
  const peak = y[peakIdx];
  // A set-point change: the final value is most of the peak; else a rejected disturbance.
  const setPoint = Math.abs(yFinal) > 0.1 * Math.abs(peak);
  let overshoot = 0;
  if (setPoint) {
    const s = Math.sign(yFinal);
    for (let i = 0; i < y.length; i++) overshoot = Math.max(overshoot, s * (y[i] - yFinal));
  } else {
    const s = Math.sign(peak);
    for (let i = peakIdx; i < y.length; i++) overshoot = Math.max(overshoot, -s * (y[i] - yFinal));
  }
  let last = -1;
  for (let i = 0; i < y.length; i++) if (Math.abs(y[i] - yFinal) > bandV) last = i;
  let settlingTime: number | null;
  if (last === -1) settlingTime = 0;
  else if (last === y.length - 1) settlingTime = null;
  else {
    // Interpolate the band crossing between samples last and last + 1.
    const e0 = Math.abs(y[last] - yFinal);
    const e1 = Math.abs(y[last + 1] - yFinal);
    const frac = e0 === e1 ? 0 : (e0 - bandV) / (e0 - e1);
    settlingTime = t[last] + frac * (t[last + 1] - t[last]);
  }
  return {
    peakDeviation: peak,
    peakTimeS: t[peakIdx],
    overshoot,
    overshootFraction: setPoint ? overshoot / Math.abs(yFinal) : null,
    settlingTime,
  };
};
