/**
 * Switching-cycle simulation of the converter with its compensator and modulator: the
 * piecewise-linear power stage (switch on, switch off, and the DCM interval when a diode
 * stops conducting), the compensator's own states, and the PWM comparator (voltage mode:
 * the ramp against the compensator output) or the peak-current comparator with slope
 * compensation (current mode: Ri·iL + Se·t against the compensator output).
 *
 * Each interval is linear and time-invariant on an augmented state
 *   z = [iL, vC, x_c…, vg, i_s, θ, q1, q2, ∫v, ∫q1, 1]
 * (x_c: compensator states; vg: input voltage; i_s: load current drawn beyond R; θ: time
 * since the clock edge; q1, q2: the injected sinusoid as a harmonic oscillator; 1: the
 * constant; ∫v and ∫q1 over the current sub-step, for exact sub-step means), so it is
 * integrated exactly: z(t + τ) = e^{Mτ}·z(t) (matrix-exp.ts). The
 * interval ends at a comparator or zero-current event, found inside a sub-step by Newton
 * iteration on the Taylor polynomial of the guard g(τ) = r·e^{Mτ}·z, bracketed by the exact
 * values at the sub-step ends; the state is then advanced exactly to the event.
 *
 * Stage equations per interval (the same as the averaged model in plant.ts; output as a
 * magnitude): L·diL/dt = ag·vg − ad·vd − rl·iL − b·v,  v = Rp·(b·iL − i_s) + kR·vC,
 * C·dvC/dt = kR·(b·iL − i_s) − vC/(R + rc), kR = R/(R + rc), Rp = R·rc/(R + rc).
 */
import { expm, matVec } from './matrix-exp';
import { INTERVALS } from './plant';
import { balanceRealization, integratorEquilibrium, realizeTransfer } from './state-space';
import type { SectionedTransfer } from './transfer';
import type { ConverterInput } from './types';


/** How the switch is turned off in each cycle (it is turned on by the clock). */
export type SwitchControl =
  | { mode: 'voltage'; vramp: number }
  /** Peak current: Ri (V/A) times the switch current plus the compensation ramp Se (V/s). */
  | { mode: 'peak-current'; ri: number; se: number }
  /** Fixed duty, no feedback (for checks against closed forms). */
  | { mode: 'open-loop'; duty: number; dutyPerInjectedVolt?: number };

export interface SwitchingSetup {
  converter: ConverterInput;
  /** Load resistance (the part of the load that is a resistor), Ω. */
  loadResistance: number;
  compensator: SectionedTransfer;
  control: SwitchControl;
  /** Output the compensator regulates to (vref/H), V. */
  vTarget: number;
  /** Initial state at a clock edge: inductor current, capacitor voltage, compensator output. */
  initial: { iL: number; vC: number; vc: number };
  /** Sub-steps per switching period (samples per period). */
  substeps?: number;
}

export const MODE_ON = 0;
export const MODE_OFF = 1;
export const MODE_DCM = 2;

/** Per-cycle record. */
export interface CycleRecord {
  duty: number;
  /** The duty reached a limit (0 or the whole period). */
  saturated: boolean;
  /** The inductor current reached zero with the diode off (DCM interval). */
  dcm: boolean;
}

/**
 * Values at the end of a sub-step (t), and the means of the output and of the injection over
 * the sub-step just ended, integrated exactly (so an edge that moves by less than a sub-step
 * still moves the mean: the duty's effect on a switched output reaches the measurement).
 */
export interface Sample {
  t: number;
  v: number;
  iL: number;
  vc: number;
  inj: number;
  vMean: number;
  injMean: number;
}

const TAYLOR_TERMS = 14;

/** A running switching simulation; advance it cycle by cycle. */
export interface SwitchingSim {
  readonly ts: number;
  readonly substeps: number;
  /** Current time, s (always at a clock edge between calls). */
  time(): number;
  /** Run `count` cycles, calling onSample at the end of every sub-step. */
  runCycles(count: number, onSample?: (s: Sample) => void, onCycle?: (c: CycleRecord) => void): void;
  /** Set the load current drawn beyond R to move to `amps` at `slewPerS` (null = at once). */
  stepLoad(amps: number, slewPerS: number | null): void;
  /** Move the input voltage to `volts`. */
  stepLine(volts: number, slewPerS: number | null): void;
  /** Inject a sinusoid amplitude·sin(2πf(t − t0)) in series with the sensed output (0 = none). */
  inject(hz: number, amplitude: number): void;
  snapshot(): Float64Array;
  restore(z: Float64Array): void;
}

export const createSwitchingSim = (setup: SwitchingSetup): SwitchingSim => {
  const cv = setup.converter;
  const ts = 1 / cv.fsw;
  const nsub = setup.substeps ?? 20;
  const h = ts / nsub;
  const r = setup.loadResistance;
  const kR = r / (r + cv.rc);
  const rp = (r * cv.rc) / (r + cv.rc);
  const comp = balanceRealization(realizeTransfer(setup.compensator));
  const nc = comp.n;
  const IL = 0;
  const VC = 1;
  const XC = 2;
  const VG = XC + nc;
  const IS = VG + 1;
  const TH = VG + 2;
  const Q1 = VG + 3;
  const Q2 = VG + 4;
  const SV = VG + 5;
  const SQ = VG + 6;
  const ONE = VG + 7;
  const n = ONE + 1;
  const diode = cv.vd > 0;
  const iv = INTERVALS[cv.topology];
  const control = setup.control;

  let slopeG = 0;
  let slopeI = 0;
  let slewEnd = -Infinity;
  let targetG = cv.vin;
  let targetI = 0;
  let omega = 0;
  let tNow = 0;

  const z = new Float64Array(n);
  z[IL] = setup.initial.iL;
  z[VC] = setup.initial.vC;
  z[VG] = cv.vin;
  z[ONE] = 1;
  const eq = integratorEquilibrium(realizeTransfer(setup.compensator), setup.initial.vc);
  if (eq) for (let i = 0; i < nc; i++) z[XC + i] = eq[i] / comp.scale[i];

  /** Rows of v, e = vTarget − v − q1, vc and the turn-off guard for a mode. */
  const rowsFor = (mode: number) => {
    const b = mode === MODE_DCM ? 0 : mode === MODE_ON ? iv.on.b : iv.off.b;
    const vRow = new Float64Array(n);
    vRow[IL] = b * rp;
    vRow[VC] = kR;
    vRow[IS] = -rp;
    const eRow = new Float64Array(n);
    for (let j = 0; j < n; j++) eRow[j] = -vRow[j];
    eRow[ONE] += setup.vTarget;
    eRow[Q1] -= 1;
    const vcRow = new Float64Array(n);
    for (let j = 0; j < n; j++) vcRow[j] = comp.d * eRow[j];
    for (let i = 0; i < nc; i++) vcRow[XC + i] += comp.c[i];
    const guard = new Float64Array(n);
    if (control.mode === 'open-loop') {
      guard[TH] = 1;
      guard[ONE] = -control.duty * ts;
      guard[Q1] = -(control.dutyPerInjectedVolt ?? 0) * ts;
    } else {
      for (let j = 0; j < n; j++) guard[j] = -vcRow[j];
      if (control.mode === 'voltage') guard[TH] += control.vramp / ts;
      else {
        guard[IL] += control.ri;
        guard[TH] += control.se;
      }
    }
    return { vRow, eRow, vcRow, guard };
  };
  const rows = [rowsFor(MODE_ON), rowsFor(MODE_OFF), rowsFor(MODE_DCM)];

  const matrixFor = (mode: number, slewing: boolean): Float64Array => {
    const m = new Float64Array(n * n);
    const set = (i: number, j: number, v: number) => {
      m[i * n + j] += v;
    };
    if (mode !== MODE_DCM) {
      const it = mode === MODE_ON ? iv.on : iv.off;
      set(IL, IL, -(cv.rl + it.b * rp) / cv.l);
      set(IL, VC, (-it.b * kR) / cv.l);
      set(IL, VG, it.ag / cv.l);
      set(IL, IS, (it.b * rp) / cv.l);
      set(IL, ONE, (-it.ad * cv.vd) / cv.l);
      set(VC, IL, (it.b * kR) / cv.c);
    }
    set(VC, VC, -1 / ((r + cv.rc) * cv.c));
    set(VC, IS, -kR / cv.c);
    const { eRow } = rows[mode];
    for (let i = 0; i < nc; i++) {
      for (let j = 0; j < nc; j++) set(XC + i, XC + j, comp.a[i * nc + j]);
      for (let j = 0; j < n; j++) set(XC + i, j, comp.b[i] * eRow[j]);
    }
    if (slewing) {
      set(VG, ONE, slopeG);
      set(IS, ONE, slopeI);
    }
    set(TH, ONE, 1);
    const { vRow } = rows[mode];
    for (let j = 0; j < n; j++) set(SV, j, vRow[j]);
    set(SQ, Q1, 1);
    set(Q1, Q2, omega);
    set(Q2, Q1, -omega);
    return m;
  };

  // Matrices and full-sub-step transitions, rebuilt when the slopes or the injection change.
  let mats: Float64Array[][] = [];
  let phis: Float64Array[][] = [];
  const rebuild = () => {
    mats = [0, 1, 2].map((mode) => [matrixFor(mode, false), matrixFor(mode, true)]);
    phis = mats.map((pair) => pair.map((m) => expm(m, n, h)));
  };
  rebuild();

  const dot = (row: Float64Array, x: Float64Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += row[i] * x[i];
    return s;
  };

  const tmp = new Float64Array(n);
  const wk = Array.from({ length: TAYLOR_TERMS + 1 }, () => new Float64Array(n));
  const coef = new Float64Array(TAYLOR_TERMS + 1);

  /** τ in (0, span] where row·e^{Mτ}·z crosses zero upward, given g(0) < 0 ≤ g(span). */
  const locate = (m: Float64Array, row: Float64Array, g0: number, g1: number, span: number): number => {
    wk[0].set(z);
    let fact = 1;
    coef[0] = dot(row, wk[0]);
    for (let k = 1; k <= TAYLOR_TERMS; k++) {
      matVec(m, wk[k - 1], n, wk[k]);
      fact *= k;
      coef[k] = dot(row, wk[k]) / fact;
    }
    const poly = (tau: number) => {
      let p = coef[TAYLOR_TERMS];
      let d = 0;
      for (let k = TAYLOR_TERMS; k >= 1; k--) {
        d = d * tau + p;
        p = p * tau + coef[k - 1];
      }
      return [p, d];
    };
    let lo = 0;
    let hi = span;
    let tau = (span * g0) / (g0 - g1);
    for (let it = 0; it < 60; it++) {
      const [p, d] = poly(tau);
      if (p < 0) lo = tau;
      else hi = tau;
      let next = d > 0 ? tau - p / d : 0.5 * (lo + hi);
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      if (Math.abs(next - tau) <= 1e-13 * span) {
        tau = next;
        break;
      }
      tau = next;
    }
    return Math.min(Math.max(tau, 0), span);
  };

  /**
   * tmp ← e^{Mτ}·z for τ within a sub-step, by the exponential's Taylor series applied to the
   * vector, Σ (Mτ)^k·z/k!, summed until a term no longer changes the sum in double precision
   * (a tenth of the cost of a Padé exponential of the matrix; the spectral radius times a
   * sub-step is below 1 for any loop this product analyses, so the terms fall fast).
   */
  const taylorInto = (m: Float64Array, tau: number, out: Float64Array) => {
    out.set(z);
    termA.set(z);
    let scale = 0;
    for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(z[i]));
    for (let k = 1; k <= 60; k++) {
      matVec(m, termA, n, termB);
      let big = 0;
      for (let i = 0; i < n; i++) {
        const v = (termB[i] * tau) / k;
        termA[i] = v;
        out[i] += v;
        const a = Math.abs(v);
        if (a > big) big = a;
      }
      if (big <= 1e-17 * scale && k > 3) break;
    }
  };
  const termA = new Float64Array(n);
  const termB = new Float64Array(n);

  const advanceExact = (m: Float64Array, tau: number) => {
    if (tau <= 0) return;
    taylorInto(m, tau, tmp);
    z.set(tmp);
  };

  let mode = MODE_ON;

  const runCycles: SwitchingSim['runCycles'] = (count, onSample, onCycle) => {
    for (let c = 0; c < count; c++) {
      const cycleStart = tNow;
      z[TH] = 0;
      let offAt = -1;
      // Clock edge: on, unless the comparator already says off (duty 0).
      mode = MODE_ON;
      if (dot(rows[MODE_ON].guard, z) >= 0) {
        mode = diode && z[IL] <= 0 ? MODE_DCM : MODE_OFF;
        offAt = 0;
      }
      for (let j = 0; j < nsub; j++) {
        const gridT = cycleStart + (j + 1) * h;
        let pos = cycleStart + j * h;
        while (pos < gridT) {
          const slewing = pos < slewEnd;
          // Stop at the end of a slew inside this sub-step.
          const stopAt = slewing && slewEnd < gridT ? slewEnd : gridT;
          const span = stopAt - pos;
          const m = mats[mode][slewing ? 1 : 0];
          const full = Math.abs(span - h) <= 1e-9 * h;
          if (full) matVec(phis[mode][slewing ? 1 : 0], z, n, tmp);
          else taylorInto(m, span, tmp);
          // Event guards of this interval.
          let row: Float64Array | null = null;
          if (mode === MODE_ON) row = rows[MODE_ON].guard;
          else if (mode === MODE_OFF && diode) row = NEG_IL;
          if (row) {
            const g0 = dot(row, z);
            const g1 = dot(row, tmp);
            if (g0 >= 0) {
              // Already past the threshold (a jump of vc or the current): switch now.
              if (mode === MODE_ON) offAt = pos - cycleStart;
              switchMode();
              continue;
            }
            if (g1 >= 0) {
              const tau = locate(m, row, g0, g1, span);
              advanceExact(m, tau);
              pos += tau;
              if (mode === MODE_ON) offAt = pos - cycleStart;
              switchMode();
              continue;
            }
          }
          z.set(tmp);
          pos = stopAt;
          if (pos === slewEnd) {
            z[VG] = targetG;
            z[IS] = targetI;
          }
        }
        tNow = gridT;
        if (onSample) sample(onSample, gridT);
        z[SV] = 0;
        z[SQ] = 0;
      }
      tNow = cycleStart + ts;
      if (offAt < 0) offAt = ts;
      onCycle?.({ duty: offAt / ts, saturated: offAt <= 0 || offAt >= ts, dcm: dcmSeen || mode === MODE_DCM });
      dcmSeen = false;
    }
  };

  let dcmSeen = false;
  const NEG_IL = new Float64Array(n);
  NEG_IL[IL] = -1;

  function switchMode() {
    if (mode === MODE_ON) {
      mode = MODE_OFF;
      if (diode && z[IL] <= 0) {
        mode = MODE_DCM;
        dcmSeen = true;
      }
    } else if (mode === MODE_OFF) {
      mode = MODE_DCM;
      z[IL] = 0;
      dcmSeen = true;
    }
  }

  function sample(onSample: (s: Sample) => void, t: number) {
    const rr = rows[mode];
    onSample({ t, v: dot(rr.vRow, z), iL: z[IL], vc: dot(rr.vcRow, z), inj: z[Q1], vMean: z[SV] / h, injMean: z[SQ] / h });
  }

  const setSlew = (index: number, target: number, slewPerS: number | null) => {
    const delta = target - z[index];
    if (slewPerS === null || !(slewPerS > 0) || delta === 0) {
      z[index] = target;
      return;
    }
    if (index === VG) {
      slopeG = Math.sign(delta) * slewPerS;
      targetG = target;
      targetI = z[IS];
      slopeI = 0;
    } else {
      slopeI = Math.sign(delta) * slewPerS;
      targetI = target;
      targetG = z[VG];
      slopeG = 0;
    }
    slewEnd = tNow + Math.abs(delta) / slewPerS;
    rebuild();
  };

  return {
    ts,
    substeps: nsub,
    time: () => tNow,
    runCycles,
    stepLoad: (amps, slew) => setSlew(IS, amps, slew),
    stepLine: (volts, slew) => setSlew(VG, volts, slew),
    inject: (hz, amplitude) => {
      omega = 2 * Math.PI * hz;
      z[Q1] = 0;
      z[Q2] = amplitude;
      rebuild();
    },
    snapshot: () => z.slice(),
    restore: (saved) => z.set(saved),
  };
};
