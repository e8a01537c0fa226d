import { describe, expect, it } from 'vitest';
import { preparePlant } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { createSwitchingSim } from '@/lib/engine/switching';
import { loopCompensatorTransfer } from '@/lib/engine/analyze';
import { measureSteadyState, modelCheck, simulatorFor, switchingStep } from '@/lib/engine/switching-check';
import { transferEvaluator } from '@/lib/engine/sweep';
import { multiplyTransfers, transferFromPolys, wrapDeg } from '@/lib/engine/transfer';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { expectAbs, expectRel } from './helpers';

const BUCK = SAMPLE_DESIGNS[0].request;

/**
 * Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., ch. 2 (from memory):
 * ideal buck in CCM, volt-second balance V = D·Vg; inductor ripple Δi = (Vg − V)·D·Ts/L
 * peak to peak; output ripple from the capacitor charge Δv = Δi·Ts/(8C) peak to peak.
 */
describe('switching simulation of an open-loop ideal buck against the closed forms (Erickson & Maksimović ch. 2)', () => {
  const cv = { topology: 'buck' as const, vin: 12, vout: 5, iout: 2, fsw: 200e3, l: 22e-6, rl: 0, c: 47e-6, rc: 0, vd: 0 };
  const d = 0.4;
  const r = 2.4 / 2; // any load: the duty sets the output
  const sim = createSwitchingSim({
    converter: cv,
    loadResistance: r,
    compensator: { gain: 0, originOrder: 0, num: [], den: [] },
    control: { mode: 'open-loop', duty: d },
    vTarget: 0,
    initial: { iL: 2, vC: d * 12, vc: 0 },
  });
  // Settle: the LC tank with R = 1.2 Ω decays with RC = 56 µs; 4000 cycles = 20 ms.
  sim.runCycles(4000);
  const { summary } = measureSteadyState(sim, 20);
  it('average output = D·Vg (volt-second balance)', () => expectRel(summary.voutAvg, d * 12, 1e-6));
  it('average inductor current = V/R', () => expectRel(summary.inductorAvg, (d * 12) / r, 1e-6));
  // The closed form holds v constant over the period (small-ripple approximation): within 0.1 %.
  it('inductor ripple = (Vg − V)·D·Ts/L', () => expectRel(summary.inductorRipplePp, ((12 - 4.8) * d) / (22e-6 * 200e3), 1e-3));
  it('output ripple = Δi·Ts/(8C) (the sampled peak within 1 %: 20 samples per period)', () => {
    const di = ((12 - 4.8) * d) / (22e-6 * 200e3);
    expectRel(summary.voutRipplePp, di / (8 * 47e-6 * 200e3), 0.01);
  });
  it('the duty is exactly the set one', () => expectAbs(summary.duty, d, 1e-12));
});

describe('closed-loop switching simulation settles at the averaged DC operating point', () => {
  it.each(SAMPLE_DESIGNS.map((s) => [s.key, s.request] as [string, AnalyzeRequest]))('%s', (_k, req) => {
    const p = preparePlant(req);
    const sim = simulatorFor(req, p);
    sim.runCycles(1500);
    const { summary } = measureSteadyState(sim, 10);
    // The integrator holds the mean output at vout; the duty and current follow the averaged model
    // up to the ripple's second-order effects (common practice: within 1 %).
    expectRel(summary.voutAvg, req.converter.vout, 1e-3, 'vout');
    expectRel(summary.duty, p.operatingPoint.duty, 0.01, 'duty');
    expectRel(summary.inductorAvg, p.operatingPoint.inductorCurrent, 0.01, 'iL');
    expect(summary.dcm).toBe(false);
    expect(summary.saturated).toBe(false);
  });
});

/**
 * The averaged model is accurate well below fsw for voltage-mode PWM (Erickson & Maksimović
 * ch. 7; the small-ripple approximation): extracted loop gain within 0.5 dB and 3° below fsw/10.
 */
describe('loop gain extracted from the switching waveforms against the averaged model (voltage-mode buck)', () => {
  const fsw = BUCK.converter.fsw;
  const result = modelCheck(BUCK, [fsw / 200, fsw / 80, fsw / 40, fsw / 20, fsw / 10, fsw / 3]);
  it('below fsw/10: within 0.5 dB and 3°', () => {
    const low = result.points.filter((p) => p.hz <= fsw / 10 + 1);
    expect(low.length).toBe(5);
    for (const p of low) {
      expect(Math.abs(p.errorDb), `${p.hz} Hz: ${p.errorDb} dB`).toBeLessThan(0.5);
      expect(Math.abs(p.errorDeg), `${p.hz} Hz: ${p.errorDeg}°`).toBeLessThan(3);
    }
  });
  it('reports the frequencies it used (fsw/N) with the model beside them', () => {
    expect(result.points.map((p) => Math.round(fsw / p.hz))).toEqual([200, 80, 40, 20, 10, 3]);
    for (const p of result.points) expectAbs(p.errorDb, p.magDb - p.modelMagDb, 1e-9);
  });
});

/**
 * Peak current mode: without slope compensation the current loop is unstable above D = 0.5
 * (subharmonic oscillation, alternate cycles long and short); with Se ≥ half the inductor
 * current's down-slope (sensed) it is stable at any duty (Ridley, "A new continuous-time
 * model for current-mode control", IEEE Trans. Power Electronics, 1991; from memory).
 */
describe('peak-current comparator: subharmonic oscillation above D = 0.5 and its cure by slope compensation', () => {
  const cv = { topology: 'buck' as const, vin: 5, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.01, c: 100e-6, rc: 0.002, vd: 0 };
  const ri = 0.5;
  const sfSensed = (ri * 3.3) / 4.7e-6; // V/s
  const run = (se: number) => {
    const p = preparePlant({ converter: cv, modulator: { vramp: 1 }, feedback: { vref: 0.8 } });
    const sim = createSwitchingSim({
      converter: p.converter,
      loadResistance: p.operatingPoint.loadResistance,
      // A negligible integrator holds the control voltage where it starts (open current loop only).
      compensator: { gain: 1e-9, originOrder: -1, num: [], den: [] },
      control: { mode: 'peak-current', ri, se },
      vTarget: 0,
      initial: { iL: 1.8, vC: 3.3, vc: ri * 2.3 + (se * 0.66) / 500e3 },
    });
    sim.runCycles(3000);
    const duties: number[] = [];
    sim.runCycles(40, undefined, (c) => duties.push(c.duty));
    return Math.max(...duties) - Math.min(...duties);
  };
  it('Se = 0 at D ≈ 0.66: the duty alternates', () => expect(run(0)).toBeGreaterThan(0.05));
  it('Se = Sf (sensed down-slope): one duty every cycle', () => expect(run(sfSensed)).toBeLessThan(1e-6));
});

describe('switching load step next to the averaged step (buck sample)', () => {
  const step = { kind: 'load' as const, from: 1.5, to: 3 };
  const r = switchingStep(BUCK, step);
  it('the cycle-averaged dip agrees with the averaged model within 10 % (ripple aside)', () => {
    const dip = Math.min(...r.cycles.voutAvg) - BUCK.converter.vout;
    expectRel(dip, r.averaged.peakDeviation, 0.1);
  });
  it('returns to vout with the integrator', () => {
    const last = r.cycles.voutAvg[r.cycles.voutAvg.length - 1];
    expectAbs(last, BUCK.converter.vout, 0.002);
    expect(r.outsideModel).toEqual([]);
  });
});

/**
 * Current mode toward fsw/2: the loop gain read from the switching waveforms of a peak
 * current-mode buck follows Ridley's sampled-data model (R. B. Ridley, "A new, continuous-time
 * model for current-mode control", IEEE Trans. Power Electronics 6(2), 1991: the double pole at
 * fsw/2 with Qp = 1/(π(mc·D' − 0.5))), while the first-order model that treats the current loop
 * as ideal, Gvc = (R/Ri)·(1 + s·rc·C)/(1 + s·(R + rc)·C) (Erickson & Maksimović, Fundamentals
 * of Power Electronics, 2nd ed., ch. 12, the simple approximation; from memory), departs from
 * it more and more toward fsw/2: the known divergence the sampled-data model exists to capture.
 */
describe('peak current-mode buck: the switching loop gain toward fsw/2 follows Ridley 1991, not the first-order model', () => {
  const req: AnalyzeRequest = {
    converter: { topology: 'buck', vin: 12, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.02, c: 100e-6, rc: 0.005, vd: 0 },
    modulator: { mode: 'peak-current', ri: 0.5, se: 5e4 },
    feedback: { vref: 0.8 },
    compensator: { type: 'type2', r1: 10e3, r2: 20e3, c1: 4.7e-9, c2: 47e-12 },
  };
  const fsw = req.converter.fsw;
  const prepared = preparePlant(req);
  const r = prepared.operatingPoint.loadResistance;
  const { rc, c } = prepared.converter;
  const firstOrder = transferFromPolys([r / 0.5, (r / 0.5) * rc * c], [1, (r + rc) * c]);
  const firstLoop = transferEvaluator(multiplyTransfers(firstOrder, loopCompensatorTransfer(prepared, req.compensator)), 10);
  const points = modelCheck(req, [fsw / 40, fsw / 10, fsw / 6, fsw / 4, fsw / 3]).points;
  const firstErrDeg = points.map((p) => wrapDeg(p.phaseDeg - firstLoop(p.hz).phaseDeg));
  const firstErrDb = points.map((p) => p.magDb - firstLoop(p.hz).magDb);

  it('the sampling pair is there: Qp between 1 and 2 at this duty', () => {
    expect(prepared.modulator.mode === 'peak-current' && prepared.modulator.qp).toBeGreaterThan(1);
    expect(prepared.modulator.mode === 'peak-current' && prepared.modulator.qp).toBeLessThan(2);
  });
  it("Ridley's model: within 1 dB and 5° up to fsw/3", () => {
    for (const p of points) {
      expect(Math.abs(p.errorDb), `${p.hz} Hz: ${p.errorDb} dB`).toBeLessThan(1);
      expect(Math.abs(p.errorDeg), `${p.hz} Hz: ${p.errorDeg}°`).toBeLessThan(5);
    }
  });
  it('the first-order model: its phase error grows toward fsw/2 and passes 15° above fsw/6', () => {
    for (let i = 1; i < points.length; i++) expect(Math.abs(firstErrDeg[i])).toBeGreaterThan(Math.abs(firstErrDeg[i - 1]));
    expect(Math.abs(firstErrDeg[points.length - 1])).toBeGreaterThan(15);
    expect(Math.abs(firstErrDeg[2])).toBeGreaterThan(10);
  });
  it("above fsw/10 Ridley's model is closer than the first-order one, in phase and in magnitude", () => {
    points.forEach((p, i) => {
      if (p.hz < fsw / 10 + 1) return;
      expect(Math.abs(p.errorDeg)).toBeLessThan(Math.abs(firstErrDeg[i]) / 4);
      expect(Math.abs(p.errorDb)).toBeLessThan(Math.abs(firstErrDb[i]));
    });
  });
});
