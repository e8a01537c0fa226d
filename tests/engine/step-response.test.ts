/**
 * The averaged step response (lib/engine/step-response.ts) and the closed-loop responses
 * (lib/engine/closed-loop.ts) of real designs: identities of the closed loop, the checks for
 * steps outside the model, and agreement with ngspice's transient analysis of the exported
 * large-signal averaged netlist (a general-purpose circuit simulator; a small step, where the
 * large-signal and the linearised model must agree).
 */
import { describe, expect, it } from 'vitest';
import { preparePlant } from '@/lib/engine/analyze';
import { closedLoopResponses, complexAt, loopBlocks } from '@/lib/engine/closed-loop';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { buildSpiceNetlist } from '@/lib/engine/spice-netlist';
import { simulateStepResponse } from '@/lib/engine/step-response';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';
import { ngspiceAvailable, readNgspiceTable, runNgspice } from '../support/ngspice';
import { expectAbs, expectRel } from './helpers';

const haveNgspice = ngspiceAvailable();
const [BUCK, BOOST, BUCK_BOOST] = SAMPLE_DESIGNS.map((s) => s.request);

describe('closed-loop responses (Erickson & Maksimović ch. 9: Zout/(1+T), Gvg/(1+T), (1/H)·T/(1+T))', () => {
  it.each([BUCK, BOOST, BUCK_BOOST].map((r) => [r.converter.topology, r] as [string, AnalyzeRequest]))('%s: identities at every point', (_t, req) => {
    const prepared = preparePlant(req);
    const cl = closedLoopResponses(prepared, req.compensator, 60);
    const b = loopBlocks(prepared, req.compensator);
    const [p, gc, zo] = [complexAt(b.control), complexAt(b.compensator), complexAt(b.zout)];
    for (const i of [0, 57, 211, 399]) {
      const hz = cl.f[i];
      const [pr, pi] = p(hz);
      const [cr, ci] = gc(hz);
      const onePlusT = Math.hypot(1 + pr * cr - pi * ci, pr * ci + pi * cr);
      const [zr, zi] = zo(hz);
      expectAbs(cl.zoutClosed.magDb[i], 20 * Math.log10(Math.hypot(zr, zi) / onePlusT), 1e-9);
      expectAbs(cl.zoutOpen.magDb[i] - cl.zoutClosed.magDb[i], cl.lineOpen.magDb[i] - cl.lineClosed.magDb[i], 1e-9);
    }
    // With the integrator, T → ∞ at low frequency: the output follows the reference times 1/H.
    expectAbs(cl.reference.magDb[0], 20 * Math.log10(req.converter.vout / req.feedback.vref), 0.01);
    expect(cl.mainsRippleHz).toBe(120);
    expect(cl.zoutClosedPeakOhm).toBeGreaterThan(0);
    expect(cl.lineRejectionAtMainsDb).toBeLessThan(-20);
  });
});

describe('step response checks', () => {
  it('a load step inside the model: no reason given, back to vout, settles', () => {
    const r = simulateStepResponse(BUCK, { kind: 'load', from: 1.5, to: 3 });
    expect(r.outsideModel).toEqual([]);
    expect(r.peakDeviation).toBeLessThan(0);
    expectAbs(r.finalVout, 5, 1e-9);
    expect(r.settlingTime).not.toBeNull();
    expect(r.t.length).toBe(r.vout.length);
  });
  it('a step too large for the duty range is flagged', () => {
    const r = simulateStepResponse(BUCK, { kind: 'load', from: 0.5, to: 60 });
    expect(r.outsideModel.join(' ')).toMatch(/duty cycle would reach/);
  });
  it('a step to light load with a diode is flagged as DCM', () => {
    const diode = { ...BUCK, converter: { ...BUCK.converter, vd: 0.4 } };
    const r = simulateStepResponse(diode, { kind: 'load', from: 3, to: 0.2 });
    expect(r.outsideModel.join(' ')).toMatch(/DCM/);
  });
  it('a line step the stage cannot follow is flagged', () => {
    const r = simulateStepResponse(BUCK, { kind: 'line', from: 24, to: 5.01 });
    expect(r.outsideModel.length).toBeGreaterThan(0);
  });
  it('impossible steps name their field', () => {
    const err = (() => {
      try {
        simulateStepResponse(BUCK, { kind: 'load', from: 2, to: 2, band: 0.9 });
      } catch (e) {
        return e;
      }
    })();
    expect(err).toBeInstanceOf(EngineInputError);
    expect((err as EngineInputError).issues.map((i) => i.path).sort()).toEqual(['step.band', 'step.to']);
  });
});

/** The exported netlist with its .ac analysis replaced by a transient with a load current step. */
const transientNetlist = (req: AnalyzeRequest, deltaA: number, t0: number, riseS: number, stopS: number, stepS: number) => {
  const base = buildSpiceNetlist(req);
  const head = base.slice(0, base.indexOf('.ac '));
  return [
    head.trimEnd(),
    `Iload out 0 PWL(0 0 ${t0} 0 ${t0 + riseS} ${deltaA})`,
    '.control',
    'set width=200',
    'set height=1000000',
    `tran ${stepS} ${stopS} 0 ${stepS}`,
    'let vo = v(out)',
    'print vo',
    'quit',
    '.endc',
    '.end',
    '',
  ].join('\n');
};

const interpolate = (t: number[], y: number[], at: number) => {
  let i = 1;
  while (i < t.length - 1 && t[i] < at) i++;
  const f = (at - t[i - 1]) / (t[i] - t[i - 1]);
  return y[i - 1] + f * (y[i] - y[i - 1]);
};

describe.skipIf(!haveNgspice)('averaged step against ngspice .tran of the exported netlist', () => {
  it.each([
    ['buck sample', BUCK],
    ['boost sample', BOOST],
  ] as [string, AnalyzeRequest][])('%s: a load step of 5 percent with 1 µs rise, within 3 percent of the dip everywhere', (_n, req) => {
    const iout = req.converter.iout;
    const delta = 0.05 * iout;
    const rise = 1e-6;
    const ours = simulateStepResponse(req, { kind: 'load', from: iout, to: iout + delta, slew: delta / rise });
    const tEnd = ours.t[ours.t.length - 1];
    const t0 = 20e-6;
    const out = runNgspice(transientNetlist(req, delta, t0, rise, t0 + tEnd, tEnd / 2000), 'step.cir');
    const rows = readNgspiceTable(out, ['time', 'vo']);
    expect(rows.length).toBeGreaterThan(100);
    const ts = rows.map((r) => r[0] - t0);
    const vs = rows.map((r) => r[1]);
    const v0 = interpolate(ts, vs, -1e-6);
    expectRel(v0, req.converter.vout, 1e-4, 'DC output before the step');
    const dip = Math.abs(ours.peakDeviation);
    let worst = 0;
    for (let i = 2; i < ours.t.length; i += 5) {
      const spice = interpolate(ts, vs, ours.t[i]) - v0;
      worst = Math.max(worst, Math.abs(spice - (ours.vout[i] - req.converter.vout)));
    }
    if (process.env.PW_SPICE_VERBOSE) console.log(`worst ${worst} V, dip ${dip} V`);
    expect(worst / dip, `worst difference ${worst} V against a dip of ${dip} V`).toBeLessThan(0.03);
  });
});
