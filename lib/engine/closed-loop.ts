/**
 * Closed-loop responses of the averaged model (Erickson & Maksimović, Fundamentals of Power
 * Electronics, 2nd ed., ch. 9): with the loop gain T = Gc·P,
 *   output impedance        Zout,cl = Zout/(1 + T)
 *   line-to-output          Gvg,cl  = Gvg/(1 + T)     (audio susceptibility)
 *   reference-to-output     v/vref  = (1/H)·T/(1 + T), H = vref/vout (the divider)
 * Built from the prepared stage's transfers only, so every control mode that provides them
 * is handled alike.
 */
import type { PreparedPlant } from './analyze';
import { compensatorTransfer } from './compensator';
import type { LoopBlocks } from './linear-loop';
import { transferPolys, type SectionedTransfer } from './transfer';
import type { BodeTrace, CompensatorInput } from './types';

const TWO_PI = 2 * Math.PI;
const RAD2DEG = 180 / Math.PI;

/** The loop's four transfers from a prepared stage (open-loop line and impedance as analyze() reports them). */
export const loopBlocks = (prepared: PreparedPlant, comp: CompensatorInput): LoopBlocks => ({
  control: prepared.plantTransfer,
  line: prepared.model.gvg,
  zout: prepared.model.zout,
  compensator: compensatorTransfer(comp),
});

/** Complex H(jω) of a sectioned transfer, [re, im], by Horner on the full polynomials. */
export const complexAt = (h: SectionedTransfer): ((hz: number) => [number, number]) => {
  const { num, den } = transferPolys(h);
  const horner = (p: number[], w: number): [number, number] => {
    let re = 0;
    let im = 0;
    for (let k = p.length - 1; k >= 0; k--) {
      const r = -im * w + p[k];
      im = re * w;
      re = r;
    }
    return [re, im];
  };
  return (hz) => {
    const w = TWO_PI * hz;
    const [nr, ni] = horner(num, w);
    const [dr, di] = horner(den, w);
    const dd = dr * dr + di * di;
    return [(nr * dr + ni * di) / dd, (ni * dr - nr * di) / dd];
  };
};

const db = (re: number, im: number) => 10 * Math.log10(re * re + im * im);

/** Phase trace continued without 360° jumps (the Bode convention), starting at its principal value. */
const unwrapInPlace = (deg: number[]) => {
  for (let i = 1; i < deg.length; i++) {
    let d = deg[i] - deg[i - 1];
    while (d > 180) {
      deg[i] -= 360;
      d -= 360;
    }
    while (d < -180) {
      deg[i] += 360;
      d += 360;
    }
  }
};

export interface ClosedLoopResponses {
  f: number[];
  /** |Zout| open and closed loop in dBΩ, phase in degrees. */
  zoutOpen: BodeTrace;
  zoutClosed: BodeTrace;
  /** Line-to-output open and closed loop, dB and degrees. */
  lineOpen: BodeTrace;
  lineClosed: BodeTrace;
  /** Reference-to-output (1/H)·T/(1+T), dB and degrees. */
  reference: BodeTrace;
  /** Peak of |Zout/(1+T)| over the sweep, Ω, and where it occurs, Hz. */
  zoutClosedPeakOhm: number;
  zoutClosedPeakHz: number;
  /** |Gvg/(1+T)| in dB at fsw (beyond the averaged model's range; read as an estimate). */
  lineRejectionAtFswDb: number;
  /** |Gvg/(1+T)| in dB at twice the mains frequency. */
  lineRejectionAtMainsDb: number;
  mainsRippleHz: number;
}

/**
 * Closed-loop responses on the prepared sweep grid. `mainsHz` (50 or 60) sets the rectified
 * mains ripple frequency 2·mainsHz read out for line rejection.
 */
export const closedLoopResponses = (prepared: PreparedPlant, comp: CompensatorInput, mainsHz = 50): ClosedLoopResponses => {
  const blocks = loopBlocks(prepared, comp);
  const p = complexAt(blocks.control);
  const gc = complexAt(blocks.compensator);
  const gvg = complexAt(blocks.line);
  const zo = complexAt(blocks.zout);
  const invH = Math.abs(prepared.converter.vout) / prepared.vref;
  const at = (hz: number) => {
    const [pr, pi] = p(hz);
    const [cr, ci] = gc(hz);
    const tr = pr * cr - pi * ci;
    const ti = pr * ci + pi * cr;
    // 1/(1 + T)
    const dr = 1 + tr;
    const dd = dr * dr + ti * ti;
    const sr = dr / dd;
    const si = -ti / dd;
    const mul = ([ar, ai]: [number, number]): [number, number] => [ar * sr - ai * si, ar * si + ai * sr];
    const z = zo(hz);
    const g = gvg(hz);
    const ref = mul([tr * invH, ti * invH]);
    return { z, zc: mul(z), g, gcL: mul(g), ref };
  };
  const f = [...prepared.grid.f];
  const traces = { zoutOpen: [], zoutClosed: [], lineOpen: [], lineClosed: [], reference: [] } as Record<string, [number, number][]>;
  for (const hz of f) {
    const r = at(hz);
    traces.zoutOpen.push(r.z);
    traces.zoutClosed.push(r.zc);
    traces.lineOpen.push(r.g);
    traces.lineClosed.push(r.gcL);
    traces.reference.push(r.ref);
  }
  const toBode = (pts: [number, number][]): BodeTrace => {
    const phaseDeg = pts.map(([re, im]) => Math.atan2(im, re) * RAD2DEG);
    unwrapInPlace(phaseDeg);
    return { magDb: pts.map(([re, im]) => db(re, im)), phaseDeg };
  };
  let peakIdx = 0;
  const zc = traces.zoutClosed;
  const mag = (v: [number, number]) => Math.hypot(v[0], v[1]);
  for (let i = 1; i < zc.length; i++) if (mag(zc[i]) > mag(zc[peakIdx])) peakIdx = i;
  const mainsRippleHz = 2 * mainsHz;
  const lineAt = (hz: number) => {
    const [re, im] = at(hz).gcL;
    return db(re, im);
  };
  return {
    f,
    zoutOpen: toBode(traces.zoutOpen),
    zoutClosed: toBode(zc),
    lineOpen: toBode(traces.lineOpen),
    lineClosed: toBode(traces.lineClosed),
    reference: toBode(traces.reference),
    zoutClosedPeakOhm: mag(zc[peakIdx]),
    zoutClosedPeakHz: f[peakIdx],
    lineRejectionAtFswDb: lineAt(prepared.converter.fsw),
    lineRejectionAtMainsDb: lineAt(mainsRippleHz),
    mainsRippleHz,
  };
};
