/**
 * Agreement with a circuit simulator: ngspice (Debian's, /usr/bin/ngspice) runs the netlist of
 * lib/engine/spice-netlist.ts — the state-space averaged power stage as behavioural sources,
 * the compensator from its parts around an ideal op-amp, the PWM gain — finds the operating
 * point itself and computes T = −V(sense)/V(fb) by AC analysis. The engine must agree within
 * 0.1 dB and 1° at every printed frequency (20 per decade), and on the duty cycle.
 * Designs are invented for this test (not the samples).
 */
import { describe, expect, it } from 'vitest';
import { evaluateLoopGain, preparePlant } from '@/lib/engine/analyze';
import { buildSpiceNetlist } from '@/lib/engine/spice-netlist';
import { wrapDeg } from '@/lib/engine/transfer';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { ngspiceAvailable, readNgspiceTable, readNgspiceValue, runNgspice } from '../support/ngspice';

// Skipped with a message when ngspice is missing; a failure under CI=true (tests/support/ngspice.ts).
const haveNgspice = ngspiceAvailable();

const DESIGNS: [string, AnalyzeRequest][] = [
  [
    'buck 48 → 12 V, 250 kHz, diode, Type III',
    {
      converter: { topology: 'buck', vin: 48, vout: 12, iout: 2, fsw: 250e3, l: 22e-6, rl: 0.015, c: 100e-6, rc: 0.01, vd: 0.5 },
      modulator: { vramp: 2 },
      feedback: { vref: 1.0 },
      compensator: { type: 'type3', r1: 20e3, r2: 10e3, r3: 500, c1: 3.3e-9, c2: 100e-12, c3: 2.2e-9 },
    },
  ],
  [
    'boost 5 → 15 V, 500 kHz, diode, Type II',
    {
      converter: { topology: 'boost', vin: 5, vout: 15, iout: 0.3, fsw: 500e3, l: 10e-6, rl: 0.05, c: 220e-6, rc: 0.06, vd: 0.4 },
      modulator: { vramp: 1.2 },
      feedback: { vref: 1.25 },
      compensator: { type: 'type2', r1: 10e3, r2: 30e3, c1: 22e-9, c2: 470e-12 },
    },
  ],
  [
    'buck-boost 9 → −5 V, 200 kHz, diode, Type III without C2',
    {
      converter: { topology: 'buck-boost', vin: 9, vout: 5, iout: 0.5, fsw: 200e3, l: 33e-6, rl: 0.08, c: 330e-6, rc: 0.04, vd: 0.3 },
      modulator: { vramp: 1 },
      feedback: { vref: 0.8 },
      compensator: { type: 'type3', r1: 10e3, r2: 15e3, r3: 1e3, c1: 10e-9, c2: 0, c3: 4.7e-9 },
    },
  ],
  [
    'buck-boost 15 → −24 V, 150 kHz, synchronous, Type II',
    {
      converter: { topology: 'buck-boost', vin: 15, vout: 24, iout: 0.25, fsw: 150e3, l: 47e-6, rl: 0.1, c: 100e-6, rc: 0.02, vd: 0 },
      modulator: { vramp: 1.5 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', r1: 4.7e3, r2: 47e3, c1: 4.7e-9, c2: 100e-12 },
    },
  ],
  [
    'lossless buck 5 → 1.2 V, 1 MHz, Type I',
    {
      converter: { topology: 'buck', vin: 5, vout: 1.2, iout: 3, fsw: 1e6, l: 1e-6, rl: 0, c: 47e-6, rc: 0, vd: 0 },
      modulator: { vramp: 0.8 },
      feedback: { vref: 0.6 },
      compensator: { type: 'type1', r1: 10e3, c1: 10e-9 },
    },
  ],
];

describe.skipIf(!haveNgspice)('engine vs ngspice AC analysis of the averaged model', () => {
  it.each(DESIGNS)('%s: loop gain within 0.1 dB and 1°, duty within 1e-5', (_, req) => {
    const prepared = preparePlant(req);
    const out = runNgspice(buildSpiceNetlist(req, { pointsPerDecade: 20 }), 'loop.cir');
    const duty = readNgspiceValue(out, 'v(duty)');
    const rows = readNgspiceTable(out, ['frequency', 'loopdb', 'loopdeg']);
    expect(Math.abs(duty - prepared.operatingPoint.duty) / prepared.operatingPoint.duty).toBeLessThan(1e-5);
    expect(rows.length).toBeGreaterThanOrEqual(10);
    const loop = evaluateLoopGain(prepared, req.compensator);
    let worstDb = 0;
    let worstDeg = 0;
    for (const [hz, magDb, phaseDeg] of rows) {
      const e = loop(hz);
      worstDb = Math.max(worstDb, Math.abs(e.magDb - magDb));
      worstDeg = Math.max(worstDeg, Math.abs(wrapDeg(e.phaseDeg - phaseDeg)));
    }
    if (process.env.PW_SPICE_VERBOSE) console.log(`${rows.length} points, worst ${worstDb.toExponential(2)} dB, ${worstDeg.toExponential(2)}°`);
    expect(worstDb, 'worst magnitude difference, dB').toBeLessThan(0.1);
    expect(worstDeg, 'worst phase difference, degrees').toBeLessThan(1);
  });
});

describe('buildSpiceNetlist (text, no simulator needed)', () => {
  it('has an .ac card, every compensator part, the divider and the sensing sign of the topology', () => {
    const [, buck] = DESIGNS[0];
    const text = buildSpiceNetlist(buck, { pointsPerDecade: 10, fStart: 20, fStop: 1e5 });
    expect(text).toMatch(/^\.ac dec 10 20 100000$/m);
    for (const el of ['R1 fb inv 20000', 'R2 inv n2 10000', 'R3 fb n3 500', 'C1 n2 ctl 3.3e-9', 'C2 inv ctl 1e-10', 'C3 n3 inv 2.2e-9', 'Rb inv 0 1818.18181818']) {
      expect(text).toContain(el);
    }
    expect(text).toMatch(/^Esense sense 0 out 0 1$/m);
    expect(text).toMatch(/^\.end$/m);
    // `quit` closes the control block, so `ngspice -b` exits 0 (batch mode without it exits 1).
    expect(text).toMatch(/^quit\n\.endc$/m);
    const [, inverting] = DESIGNS[2];
    const inv = buildSpiceNetlist(inverting);
    expect(inv).toMatch(/^Esense sense 0 0 out 1$/m);
    expect(inv).not.toMatch(/^C2 /m);
  });
});

/**
 * Every combination modulator × amplifier × conduction, agreeing with ngspice within 0.5 dB
 * and 3° from 10 Hz to fsw/5 (designs of our own). The netlist realises Ridley's modulator
 * with its sampling gain as a second-order network on the inductor current, the DCM stage as
 * the averaged switch network, the finite op-amp as VCVS + RC, the gm amplifier as a G element.
 */
const STAGES = {
  buckCcm: { topology: 'buck', vin: 12, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.02, c: 100e-6, rc: 0.005, vd: 0 },
  boostCcm: { topology: 'boost', vin: 5, vout: 12, iout: 0.5, fsw: 400e3, l: 10e-6, rl: 0.03, c: 44e-6, rc: 0.005, vd: 0.4 },
  bbCcm: { topology: 'buck-boost', vin: 12, vout: 5, iout: 1, fsw: 300e3, l: 22e-6, rl: 0.03, c: 100e-6, rc: 0.01, vd: 0.3 },
  buckDcm: { topology: 'buck', vin: 12, vout: 3.3, iout: 0.05, fsw: 500e3, l: 4.7e-6, rl: 0, c: 100e-6, rc: 0.005, vd: 0.3 },
  boostDcm: { topology: 'boost', vin: 5, vout: 12, iout: 0.02, fsw: 400e3, l: 10e-6, rl: 0, c: 44e-6, rc: 0.005, vd: 0.4 },
  bbDcm: { topology: 'buck-boost', vin: 12, vout: 5, iout: 0.02, fsw: 300e3, l: 10e-6, rl: 0, c: 100e-6, rc: 0.01, vd: 0.3 },
} as const;
const OPAMP_II = { type: 'type2', r1: 10e3, r2: 20e3, c1: 4.7e-9, c2: 47e-12 } as const;
const REAL_III = { type: 'type3', r1: 10e3, r2: 20e3, r3: 500, c1: 4.7e-9, c2: 47e-12, c3: 2.2e-9, opamp: { a0: 2e4, gbw: 2e6 } } as const;
const gmStage = (vout: number, vref: number, type: 'type2' | 'type3') => {
  const r1 = 40e3;
  const rb = (r1 * vref) / (vout - vref);
  return type === 'type2'
    ? ({ type, amplifier: 'transconductance', gm: 1e-3, ro: 2e6, rb, r1, r2: 10e3, c1: 10e-9, c2: 100e-12 } as const)
    : ({ type, amplifier: 'transconductance', gm: 0.5e-3, rb, r1, r2: 20e3, r3: 5e3, c1: 10e-9, c2: 100e-12, c3: 1e-9 } as const);
};
const VM = { vramp: 1 } as const;
const CM = (ri: number, se: number) => ({ mode: 'peak-current', ri, se }) as const;

const COMBOS: [string, AnalyzeRequest][] = [
  ['voltage × ideal op-amp × CCM (buck)', { converter: STAGES.buckCcm, modulator: VM, feedback: { vref: 0.8 }, compensator: OPAMP_II }],
  ['voltage × finite op-amp × CCM (buck)', { converter: STAGES.buckCcm, modulator: VM, feedback: { vref: 0.8 }, compensator: REAL_III }],
  ['voltage × gm × CCM (boost)', { converter: STAGES.boostCcm, modulator: VM, feedback: { vref: 1.2 }, compensator: gmStage(12, 1.2, 'type2') }],
  ['peak current × ideal op-amp × CCM (buck)', { converter: STAGES.buckCcm, modulator: CM(0.5, 5e4), feedback: { vref: 0.8 }, compensator: OPAMP_II }],
  ['peak current × finite op-amp × CCM (buck-boost)', { converter: STAGES.bbCcm, modulator: CM(0.2, 2e4), feedback: { vref: 1 }, compensator: REAL_III }],
  ['peak current × gm × CCM (boost)', { converter: STAGES.boostCcm, modulator: CM(0.1, 3e4), feedback: { vref: 1.2 }, compensator: gmStage(12, 1.2, 'type2') }],
  ['voltage × ideal op-amp × DCM (boost)', { converter: STAGES.boostDcm, modulator: VM, feedback: { vref: 1.2 }, compensator: OPAMP_II }],
  ['voltage × finite op-amp × DCM (buck)', { converter: STAGES.buckDcm, modulator: VM, feedback: { vref: 0.8 }, compensator: REAL_III }],
  ['voltage × gm × DCM (buck-boost)', { converter: STAGES.bbDcm, modulator: VM, feedback: { vref: 1 }, compensator: gmStage(5, 1, 'type3') }],
  ['peak current × ideal op-amp × DCM (buck)', { converter: STAGES.buckDcm, modulator: CM(0.5, 5e4), feedback: { vref: 0.8 }, compensator: OPAMP_II }],
  ['peak current × finite op-amp × DCM (boost)', { converter: STAGES.boostDcm, modulator: CM(0.1, 3e4), feedback: { vref: 1.2 }, compensator: REAL_III }],
  ['peak current × gm × DCM (buck-boost)', { converter: STAGES.bbDcm, modulator: CM(0.2, 0), feedback: { vref: 1 }, compensator: gmStage(5, 1, 'type3') }],
];

describe.skipIf(!haveNgspice)('engine vs ngspice: modulator × amplifier × conduction', () => {
  it.each(COMBOS)('%s: within 0.5 dB and 3° from 10 Hz to fsw/5', (name, req) => {
    const prepared = preparePlant(req);
    expect(prepared.operatingPoint.conduction, 'conduction of the design').toBe(name.includes('DCM') ? 'DCM' : 'CCM');
    const out = runNgspice(buildSpiceNetlist(req, { fStart: 10, fStop: req.converter.fsw / 5, pointsPerDecade: 20 }), 'loop.cir');
    const duty = readNgspiceValue(out, 'v(duty)');
    // A finite amplifier gain (a0, gm·ro) leaves a small DC error in the simulated output.
    expect(Math.abs(duty - prepared.operatingPoint.duty) / prepared.operatingPoint.duty).toBeLessThan(1e-3);
    const rows = readNgspiceTable(out, ['frequency', 'loopdb', 'loopdeg']);
    expect(rows.length).toBeGreaterThanOrEqual(60);
    const loop = evaluateLoopGain(prepared, req.compensator);
    let worstDb = 0;
    let worstDeg = 0;
    for (const [hz, magDb, phaseDeg] of rows) {
      const e = loop(hz);
      worstDb = Math.max(worstDb, Math.abs(e.magDb - magDb));
      worstDeg = Math.max(worstDeg, Math.abs(wrapDeg(e.phaseDeg - phaseDeg)));
    }
    if (process.env.PW_SPICE_VERBOSE) console.log(`${name}: ${rows.length} points, worst ${worstDb.toExponential(2)} dB, ${worstDeg.toExponential(2)}°`);
    expect(worstDb, 'worst magnitude difference, dB').toBeLessThan(0.5);
    expect(worstDeg, 'worst phase difference, degrees').toBeLessThan(3);
  });
});
