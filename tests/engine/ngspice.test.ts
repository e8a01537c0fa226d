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
