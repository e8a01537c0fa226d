import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import { analyze, analyzeLoop, evaluateLoopGain, loopCompensatorTransfer, marginsForCompensator, preparePlant, standardValueCompensator } from '@/lib/engine/analyze';
import { partsFromShape, shapeFromParts } from '@/lib/engine/compensator';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { snapToSeries } from '@/lib/engine/eseries';
import { evaluateTransfer, ratioBound, wrapDeg } from '@/lib/engine/transfer';
import { computeMargins } from '@/lib/engine/margins';
import { loopChecks } from '@/lib/engine/checks';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';
import { expectAbs, expectRel, makeRequest } from './helpers';

const issuesOf = (req: AnalyzeRequest) => {
  try {
    analyze(req);
  } catch (e) {
    expect(e).toBeInstanceOf(EngineInputError);
    return (e as EngineInputError).issues.map((i) => i.path);
  }
  throw new Error('expected EngineInputError');
};

describe('analyze(): physically impossible input → EngineInputError naming the field (422)', () => {
  it.each([
    ['converter.l', { converter: { l: 0 } }],
    ['converter.l', { converter: { l: -1e-6 } }],
    ['converter.c', { converter: { c: 0 } }],
    ['converter.vin', { converter: { vin: 0 } }],
    ['converter.vout', { converter: { vout: -3 } }],
    ['converter.iout', { converter: { iout: 0 } }],
    ['converter.fsw', { converter: { fsw: 0 } }],
    ['converter.rl', { converter: { rl: -0.1 } }],
    ['converter.rc', { converter: { rc: -0.1 } }],
    ['converter.vd', { converter: { vd: -0.3 } }],
    ['converter.vout', { converter: { vin: 5, vout: 5 } }],
    ['converter.vout', { converter: { vin: 3.4, vout: 3.3, iout: 10, rl: 0.05 } }],
    ['converter.vout', { converter: { topology: 'boost', vin: 12, vout: 5 } }],
    ['converter.vout', { converter: { topology: 'boost', vin: 3, vout: 60, iout: 5, rl: 0.2 } }],
    ['modulator.vramp', { modulator: { vramp: 0 } }],
    ['feedback.vref', { feedback: { vref: 0 } }],
    ['feedback.vref', { feedback: { vref: 3.3 } }],
    ['compensator.r1', { compensator: { type: 'type2', r1: 0, r2: 1e4, c1: 1e-9 } }],
    ['compensator.c1', { compensator: { type: 'type1', r1: 1e4, c1: -1e-9 } }],
    ['compensator.r2', { compensator: { type: 'type2', r1: 1e4, c1: 1e-9 } }],
    ['compensator.c2', { compensator: { type: 'type2', r1: 1e4, r2: 1e4, c1: 1e-9, c2: -1e-12 } }],
    ['compensator.r3', { compensator: { type: 'type3', r1: 1e4, r2: 1e4, c1: 1e-9, c3: 1e-9 } }],
    ['compensator.c3', { compensator: { type: 'type3', r1: 1e4, r2: 1e4, r3: 1e3, c1: 1e-9 } }],
    ['sweep.fStop', { sweep: { fStart: 1e3, fStop: 1e3, points: 100 } }],
    ['sweep.fStart', { sweep: { fStart: 0, fStop: 1e3, points: 100 } }],
  ] as [string, Parameters<typeof makeRequest>[0]][])('%s (%j)', (path, over) => {
    expect(issuesOf(makeRequest(over))).toContain(path);
  });

  it('lists every problem at once', () => {
    const paths = issuesOf(makeRequest({ converter: { l: 0, c: 0 }, modulator: { vramp: -1 } }));
    expect(paths).toEqual(expect.arrayContaining(['converter.l', 'converter.c', 'modulator.vramp']));
  });

  it('Type I ignores R2/R3/C2/C3 and does not need them', () => {
    expect(() => analyze(makeRequest({ compensator: { type: 'type1', r1: 1e4, c1: 1e-9 } }))).not.toThrow();
  });
});

describe('analyze(): the contract, field by field', () => {
  const req = makeRequest();
  const r = analyze(req);

  it('defaults: 10 Hz to fsw/2, 400 log points; E96 resistors, E12 capacitors', () => {
    expect(r.bode.f).toHaveLength(400);
    expect(r.bode.f[0]).toBe(10);
    expect(r.bode.f[399]).toBe(250e3);
    expectRel(r.bode.f[1] / r.bode.f[0], r.bode.f[300] / r.bode.f[299], 1e-12);
    expect(r.parts.resistorSeries).toBe('E96');
    expect(r.parts.capacitorSeries).toBe('E12');
  });

  it('loop = compensator + plant in dB and degrees (mod 360°)', () => {
    for (let i = 0; i < 400; i += 37) {
      expectAbs(r.bode.loop.magDb[i], r.bode.plant.magDb[i] + r.bode.compensator.magDb[i], 1e-9);
      expectAbs(wrapDeg(r.bode.loop.phaseDeg[i] - r.bode.plant.phaseDeg[i] - r.bode.compensator.phaseDeg[i]), 0, 1e-9);
    }
  });

  it('phase starts at its principal value and is continuous', () => {
    expect(r.bode.loop.phaseDeg[0]).toBeGreaterThan(-180);
    expect(r.bode.loop.phaseDeg[0]).toBeLessThanOrEqual(180);
    for (let i = 1; i < 400; i++) expect(Math.abs(r.bode.loop.phaseDeg[i] - r.bode.loop.phaseDeg[i - 1])).toBeLessThan(90);
  });

  it('phaseAtHalfFswDeg equals the loop phase at the last default sweep point (fsw/2)', () => {
    expectAbs(r.phaseAtHalfFswDeg, r.bode.loop.phaseDeg[399], 1e-9);
  });

  it('plant summary includes the modulator: DC gain = Gvd(0)/Vramp', () => {
    const r2 = analyze({ ...req, modulator: { vramp: 2 } });
    expectAbs(r2.plant.dcGainDb! - r.plant.dcGainDb!, -20 * Math.log10(2), 1e-9);
    expect(r.plant.rhpZeroHz).toBeNull();
    expect(r.compensator.polesHz[0]).toBe(0);
  });

  it('parts: ideal as given, snapped to the series, rb from the divider, snapped margins beside', () => {
    const c = req.compensator;
    expect(r.parts.ideal).toEqual({ r1: c.r1, r2: c.r2, r3: null, c1: c.c1, c2: c.c2, c3: null, rb: (c.r1 * 0.8) / (3.3 - 0.8) });
    expect(r.parts.snapped.rb).toBe(snapToSeries(r.parts.ideal.rb!, 'E96'));
    expect(r.parts.snapped.r2).toBe(snapToSeries(c.r2!, 'E96'));
    expect(r.parts.snapped.c2).toBe(snapToSeries(c.c2!, 'E12'));
    expect(r.parts.snappedMargins.crossoverHz).not.toBeNull();
    const e6 = analyze({ ...req, parts: { resistorSeries: 'E6', capacitorSeries: 'E6' } });
    expect(e6.parts.snapped.r2).toBe(snapToSeries(c.r2!, 'E6'));
  });

  it('snapped margins are computed for non-standard parts and equal the ideal ones for standard parts', () => {
    const odd = analyze({ ...req, compensator: { ...req.compensator, r2: 21.37e3, c1: 8.6e-9 } });
    expect(odd.parts.snapped.r2).toBe(21.5e3);
    expect(odd.parts.snapped.c1).toBe(8.2e-9);
    expect(odd.parts.snappedMargins.crossoverHz).not.toBe(odd.margins.crossoverHz);
    expectRel(odd.parts.snappedMargins.crossoverHz, odd.margins.crossoverHz!, 0.2);
    // Same parts as the snapped ones → the same loop, margins reused.
    const std = analyze({ ...req, compensator: { ...req.compensator, r2: 21.5e3, c1: 8.2e-9 } });
    expect(std.parts.snappedMargins).toEqual(std.margins);
    expectRel(odd.parts.snappedMargins.phaseMarginDeg, std.margins.phaseMarginDeg!, 1e-9);
  });

  it('serialises to JSON without NaN or Infinity', () => {
    const text = JSON.stringify(r);
    expect(text).not.toMatch(/NaN|Infinity/);
    const back = JSON.parse(text);
    expect(back.margins).toEqual(r.margins);
  });

  it('a request sweep is honoured', () => {
    const s = analyze({ ...req, sweep: { fStart: 100, fStop: 1e6, points: 50 } });
    expect(s.bode.f).toHaveLength(50);
    expect(s.bode.f[49]).toBe(1e6);
  });
});

describe('the sample designs give sensible loops (samples.ts)', () => {
  it.each(SAMPLE_DESIGNS.map((s) => [s.key, s] as const))('%s', (_, s) => {
    const r = analyze(s.request);
    const fsw = s.request.converter.fsw;
    expect(r.margins.phaseMarginDeg!).toBeGreaterThanOrEqual(45);
    expect(r.margins.phaseMarginDeg!).toBeLessThanOrEqual(65);
    expect(r.margins.crossoverHz!).toBeLessThan(fsw / 5);
    if (r.plant.rhpZeroHz !== null) expect(r.margins.crossoverHz!).toBeLessThan(r.plant.rhpZeroHz / 4);
    if (r.margins.gainMarginDb !== null) expect(r.margins.gainMarginDb).toBeGreaterThan(10);
    expect(r.checks).toEqual([]);
    expect(r.operatingPoint.conduction).toBe('CCM');
    // The snapped parts are the parts themselves (the samples are already standard values).
    expectRel(r.parts.snappedMargins.phaseMarginDeg, r.margins.phaseMarginDeg!, 1e-9);
  });
});

describe('Tune fast path: preparePlant + analyzeLoop', () => {
  it('matches analyze() exactly and follows a handle move through partsFromShape', () => {
    const req = SAMPLE_DESIGNS[0].request;
    const full = analyze(req);
    const prepared = preparePlant(req);
    const fast = analyzeLoop(prepared, req.compensator);
    expect(fast.margins).toEqual(full.margins);
    expect(fast.bode).toEqual(full.bode);
    expect(fast.checks).toEqual(full.checks);
    const shape = shapeFromParts(req.compensator);
    const moved = analyzeLoop(prepared, partsFromShape({ ...shape, integratorHz: shape.integratorHz * 1.5 }));
    expect(moved.margins.crossoverHz!).toBeGreaterThan(full.margins.crossoverHz!);
  });

  it('evaluateLoopGain agrees with the sampled loop on the grid', () => {
    const req = SAMPLE_DESIGNS[1].request;
    const prepared = preparePlant(req);
    const loop = analyzeLoop(prepared, req.compensator);
    const ev = evaluateLoopGain(prepared, req.compensator);
    for (const i of [0, 10, 200, 399]) {
      const p = ev(loop.bode.f[i]);
      expectAbs(p.magDb, loop.bode.loop.magDb[i], 1e-9);
      expectAbs(p.phaseDeg, loop.bode.loop.phaseDeg[i], 1e-9);
    }
  });

  it('rejects impossible compensator parts with field paths', () => {
    const prepared = preparePlant(SAMPLE_DESIGNS[1].request);
    expect(() => analyzeLoop(prepared, { type: 'type2', r1: 1e4, r2: -5, c1: 1e-9 })).toThrow(EngineInputError);
  });
});

describe('snapped-parts margins: the scan near the ideal loop', () => {
  // A deterministic spread of part changes up to ±20 % (E12 capacitors move up to about 10 %).
  let seed = 11;
  const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  const moved = (v: number | undefined) => (v === undefined ? undefined : v * (1 + 0.4 * (random() - 0.5)));
  const requests = [...SAMPLE_DESIGNS, ...MODE_SAMPLES].flatMap(({ request }) =>
    Array.from({ length: 12 }, () => {
      const c = request.compensator;
      return { ...request, compensator: { ...c, r1: moved(c.r1)!, r2: moved(c.r2), r3: moved(c.r3), c1: moved(c.c1)!, c2: moved(c.c2), c3: moved(c.c3), rb: moved(c.rb) } };
    }),
  );

  it('ratioBound holds at every frequency tried (|20·log10|H′/H|| ≤ db, |∠H′/H| ≤ deg)', () => {
    for (const req of requests) {
      const prepared = preparePlant(req);
      const gc = loopCompensatorTransfer(prepared, req.compensator);
      const snapped = loopCompensatorTransfer(prepared, standardValueCompensator(req.compensator));
      const bound = ratioBound(gc, snapped);
      if (bound === null) continue;
      for (let hz = 1; hz < 1e8; hz *= 1.07) {
        const s = new Complex(0, 2 * Math.PI * hz);
        const r = evaluateTransfer(snapped, s).div(evaluateTransfer(gc, s));
        expect(Math.abs(20 * Math.log10(r.abs()))).toBeLessThanOrEqual(bound.db + 1e-9);
        expect(Math.abs((r.arg() * 180) / Math.PI)).toBeLessThanOrEqual(bound.deg + 1e-9);
      }
    }
  });

  it('gives exactly the margins of a full scan of the snapped loop', () => {
    let hinted = 0;
    for (const req of requests) {
      const prepared = preparePlant(req);
      const snapped = standardValueCompensator(req.compensator);
      const full = marginsForCompensator(prepared, snapped);
      const result = analyze(req);
      if (ratioBound(loopCompensatorTransfer(prepared, req.compensator), loopCompensatorTransfer(prepared, snapped)) !== null) hinted++;
      expect(result.parts.snappedMargins).toEqual(full);
    }
    // The bound applies to nearly every case (else the test would only compare full scans).
    expect(hinted).toBeGreaterThan(requests.length * 0.8);
  });
});

describe('the loop pass: margins and checks found while the traces are added', () => {
  it('gives the margins and loop checks of the generic functions (computeMargins, loopChecks on the samples)', () => {
    const designs = [...SAMPLE_DESIGNS, ...MODE_SAMPLES].map((s) => s.request);
    // A Type III buck whose zeros sit far above the LC pair: conditionally stable (phase below −180° under fc).
    const req = SAMPLE_DESIGNS[0].request;
    const shape = shapeFromParts(req.compensator);
    designs.push({ ...req, compensator: partsFromShape({ ...shape, zerosHz: shape.zerosHz.map((z) => z * 4), integratorHz: shape.integratorHz * 8 }) });
    for (const design of designs) {
      const prepared = preparePlant(design);
      const result = analyzeLoop(prepared, design.compensator);
      const sampled = { f: result.bode.f, ...result.bode.loop };
      const margins = computeMargins(sampled, evaluateLoopGain(prepared, design.compensator, sampled.phaseDeg[0]));
      expect(result.margins).toEqual(margins);
      const generic = loopChecks({ margins, loop: sampled, fsw: prepared.converter.fsw, rhpZeroHz: prepared.plant.rhpZeroHz });
      const ids = result.checks.map((c) => c.id);
      for (const c of generic) expect(ids).toContain(c.id);
    }
    expect(analyze(designs[designs.length - 1]).checks.map((c) => c.id)).toContain('conditional-stability');
  });
});
