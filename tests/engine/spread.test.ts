import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { createRandom } from '@/lib/engine/random';
import { SERIES_TOLERANCE } from '@/lib/engine/eseries';
import { defaultRange, type OperatingRange } from '@/lib/engine/range';
import { MAX_SPREAD_SAMPLES, percentileOfSorted, runSpread } from '@/lib/engine/spread';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';
import { expectRel } from './helpers';

const zeroRange = (req: AnalyzeRequest): OperatingRange => ({
  vin: { min: req.converter.vin, max: req.converter.vin },
  iout: { min: req.converter.iout, max: req.converter.iout },
  l: { tol: 0 },
  c: { tol: 0 },
  rc: { min: req.converter.rc, max: req.converter.rc },
  parts: { resistorTol: 0, capacitorTol: 0 },
});

/**
 * A loop that is a pure integrator around crossover: a buck whose LC resonance (5 MHz) is far
 * above fc (1 kHz) and a Type I compensator, T ≈ (Vin/Vramp)/(s·R1·C1). Then fc = Vin/(2π·R1·C1·Vramp)
 * is inversely proportional to R1, and with R1 = R1₀(1 + t·u):  fc = fc₀/(1 + t·u).
 */
const integrator: AnalyzeRequest = {
  converter: { topology: 'buck', vin: 10, vout: 5, iout: 1, fsw: 100e6, l: 1e-7, rl: 0, c: 1e-8, rc: 0, vd: 0 },
  modulator: { vramp: 1 },
  feedback: { vref: 1 },
  // Standard values (E96, E12): the spread samples around the parts as built.
  compensator: { type: 'type1', r1: 10e3, c1: 150e-9 },
  sweep: { fStart: 10, fStop: 1e5, points: 200 },
};
const integratorRange = (resistorTol: number): OperatingRange => ({ ...zeroRange(integrator), parts: { resistorTol, capacitorTol: 0 } });

describe('tolerance spread', () => {
  for (const s of SAMPLE_DESIGNS) {
    it(`${s.key}: zero tolerances collapse to the nominal margins`, () => {
      const nominal = analyze(s.request).margins;
      const r = runSpread(s.request, zeroRange(s.request), { samples: 50, seed: 7 });
      for (const q of ['p1', 'p50', 'p99'] as const) {
        expectRel(r.percentiles.crossoverHz![q], nominal.crossoverHz!, 1e-9, `fc ${q}`);
        expectRel(r.percentiles.phaseMarginDeg![q], nominal.phaseMarginDeg!, 1e-9, `PM ${q}`);
        if (nominal.gainMarginDb === null) expect(r.percentiles.gainMarginDb).toBeNull();
        else expectRel(r.percentiles.gainMarginDb![q], nominal.gainMarginDb, 1e-9, `GM ${q}`);
      }
      expectRel(r.nominal.phaseMarginDeg, nominal.phaseMarginDeg!, 1e-9, 'nominal PM');
      expect(r.histograms.phaseMarginDeg!.counts.reduce((a, b) => a + b, 0)).toBe(50);
    });
  }

  // Parts off the series (as the handles leave them): the spread is about the circuit that will
  // be built, so with zero tolerances it is analyze()'s margins of the standard-value parts.
  const offSeries: [string, AnalyzeRequest][] = [
    ...SAMPLE_DESIGNS.map((s): [string, AnalyzeRequest] => {
      const c = s.request.compensator;
      const nudge = (v: number | undefined) => (v === undefined ? undefined : v * 1.037);
      return [s.key, { ...s.request, compensator: { ...c, r1: c.r1 * 1.029, r2: nudge(c.r2), r3: nudge(c.r3), c1: c.c1 * 1.037, c2: nudge(c.c2), c3: nudge(c.c3) } }];
    }),
    [
      'transconductance, peak current mode',
      {
        converter: { topology: 'boost', vin: 5, vout: 12, iout: 0.5, fsw: 400e3, l: 10e-6, rl: 0.03, c: 44e-6, rc: 0.005, vd: 0.4 },
        modulator: { mode: 'peak-current', ri: 0.1, se: 3e4 },
        feedback: { vref: 1.2 },
        compensator: { type: 'type2', amplifier: 'transconductance', gm: 1e-3, ro: 2e6, rb: 4444.44, r1: 40.3e3, r2: 10.3e3, c1: 10.4e-9, c2: 96e-12 },
      },
    ],
    [
      'finite op-amp Type III',
      {
        converter: { topology: 'buck', vin: 12, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.02, c: 100e-6, rc: 0.005, vd: 0 },
        modulator: { vramp: 1 },
        feedback: { vref: 0.8 },
        compensator: { type: 'type3', r1: 10.1e3, r2: 4.7e3, r3: 500, c1: 9.1e-9, c2: 230e-12, c3: 4.4e-9, opamp: { a0: 1e5, gbw: 20e6 } },
      },
    ],
  ];
  it.each(offSeries)('%s, parts off the series: zero tolerances collapse to the margins of the standard-value parts', (_, req) => {
    const a = analyze(req);
    const built = a.parts.snappedMargins;
    const r = runSpread(req, zeroRange(req), { samples: 20, seed: 3 });
    expectRel(r.nominal.phaseMarginDeg, built.phaseMarginDeg!, 1e-9, 'nominal PM = built PM');
    for (const q of ['p1', 'p50', 'p99'] as const) {
      expectRel(r.percentiles.crossoverHz![q], built.crossoverHz!, 1e-9, `fc ${q}`);
      expectRel(r.percentiles.phaseMarginDeg![q], built.phaseMarginDeg!, 1e-9, `PM ${q}`);
      if (built.gainMarginDb === null) expect(r.percentiles.gainMarginDb).toBeNull();
      else expectRel(r.percentiles.gainMarginDb![q], built.gainMarginDb, 1e-9, `GM ${q}`);
    }
    // The ideal parts give another loop: the spread is not about them.
    expect(Math.abs(a.margins.crossoverHz! - built.crossoverHz!)).toBeGreaterThan(1e-6 * built.crossoverHz!);
  });

  it('the fc of an integrator loop with one uniformly distributed part follows fc₀/(1 + t·u) (within sampling error)', () => {
    const fc0 = analyze(integrator).margins.crossoverHz!;
    expectRel(fc0, 10 / (2 * Math.PI * 10e3 * 150e-9), 1e-4, 'nominal fc = Vin/(2π·R1·C1·Vramp)');
    const t = 0.1;
    const n = 20_000;
    const r = runSpread(integrator, integratorRange(t), { samples: n, seed: 11 });
    // The q-quantile of fc is fc₀/(1 + t(1 − 2q)) (fc falls as R1 rises). Standard error of
    // a sample quantile: √(q(1−q)/n)/density, density of u = ½ (Kendall & Stuart, order statistics).
    for (const [q, key] of [[0.01, 'p1'], [0.5, 'p50'], [0.99, 'p99']] as const) {
      const expected = fc0 / (1 + t * (1 - 2 * q));
      const seU = Math.sqrt((q * (1 - q)) / n) / 0.5;
      expectRel(r.percentiles.crossoverHz![key], expected, 4 * t * seU + 1e-6, `fc ${key}`);
    }
    // A pure integrator has 90° of phase margin and no −180° crossing.
    expectRel(r.percentiles.phaseMarginDeg!.p50, 90, 1e-3, 'PM');
    expect(r.missing.gainMarginDb).toBe(n);
    expect(r.meetsTargets.share).toBe(1);
  });

  it('normal distribution: tolerance read as ±3σ, truncated; percentiles match the truncated normal', () => {
    const fc0 = analyze(integrator).margins.crossoverHz!;
    const t = 0.1;
    const n = 20_000;
    const r = runSpread(integrator, integratorRange(t), { samples: n, seed: 5, distribution: 'normal' });
    expect(r.distribution).toBe('normal');
    // Quantiles of N(0,1) truncated at ±3: z_q = Φ⁻¹(Φ(−3) + q(1 − 2Φ(−3))), computed with
    // Python's statistics.NormalDist: z_0.01 = −2.27936, z_0.99 = +2.27936.
    const zq = 2.279357877103891;
    const expected99 = fc0 / (1 - (t * zq) / 3);
    const expected1 = fc0 / (1 + (t * zq) / 3);
    // Density of u = z/3 at the quantile: 3·φ(2.279)/(1 − 2Φ(−3)) ≈ 0.0898.
    const se = (Math.sqrt((0.01 * 0.99) / n) / 0.0898) * t;
    expectRel(r.percentiles.crossoverHz!.p99, expected99, 4 * se, 'fc p99');
    expectRel(r.percentiles.crossoverHz!.p1, expected1, 4 * se, 'fc p1');
    expectRel(r.percentiles.crossoverHz!.p50, fc0, 4 * t * (Math.sqrt(0.25 / n) / (3 * 0.3989)), 'fc p50');
  });

  it('the seed reproduces the spread; another seed gives another', () => {
    const s = SAMPLE_DESIGNS[1];
    const range = defaultRange(s.request.converter);
    const a = runSpread(s.request, range, { samples: 300, seed: 42 });
    const b = runSpread(s.request, range, { samples: 300, seed: 42 });
    const c = runSpread(s.request, range, { samples: 300, seed: 43 });
    expect(b).toEqual(a);
    expect(c.percentiles.phaseMarginDeg).not.toEqual(a.percentiles.phaseMarginDeg);
  });

  it('compensator tolerances default to the parts series (E96 ±1 %, E12 ±10 %)', () => {
    const s = SAMPLE_DESIGNS[0];
    const r = runSpread(s.request, defaultRange(s.request.converter), { samples: 10, seed: 1 });
    expect(r.tolerances.resistorTol).toBe(0.01);
    expect(r.tolerances.capacitorTol).toBe(0.1);
    const e24 = runSpread({ ...s.request, parts: { resistorSeries: 'E24', capacitorSeries: 'E6' } }, defaultRange(s.request.converter), { samples: 10, seed: 1 });
    expect(e24.tolerances).toMatchObject({ resistorTol: SERIES_TOLERANCE.E24, capacitorTol: 0.2 });
  });

  it('share meeting the targets counts PM ≥ target and GM ≥ target', () => {
    const s = SAMPLE_DESIGNS[1];
    const range = defaultRange(s.request.converter);
    const strict = runSpread(s.request, range, { samples: 500, seed: 3, targets: { phaseMarginDeg: 89, gainMarginDb: 10 } });
    const loose = runSpread(s.request, range, { samples: 500, seed: 3, targets: { phaseMarginDeg: 0, gainMarginDb: 0 } });
    expect(strict.meetsTargets.share).toBe(0);
    expect(loose.meetsTargets.share).toBe(1);
  });

  it('refuses more samples than the limit, naming the field', () => {
    const s = SAMPLE_DESIGNS[0];
    expect(() => runSpread(s.request, defaultRange(s.request.converter), { samples: MAX_SPREAD_SAMPLES + 1, seed: 1 })).toThrow(EngineInputError);
  });

  it('reports progress up to the total', () => {
    const s = SAMPLE_DESIGNS[2];
    const seen: number[] = [];
    runSpread(s.request, defaultRange(s.request.converter), { samples: 600, seed: 1 }, (done) => seen.push(done));
    expect(seen).toEqual([250, 500, 600]);
  });
});

describe('seeded random numbers', () => {
  it('uniform on [0, 1) and standard normal (mean and variance within sampling error)', () => {
    const rnd = createRandom(123);
    const n = 100_000;
    let su = 0;
    let sz = 0;
    let szz = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = rnd.next();
      if (!(u >= 0 && u < 1)) outside++;
      su += u;
      const z = rnd.normal();
      sz += z;
      szz += z * z;
    }
    expect(outside).toBe(0);
    // SE of the mean: σ/√n (uniform σ² = 1/12).
    expect(Math.abs(su / n - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(sz / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(szz / n - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });

  it('percentiles interpolate between order statistics', () => {
    expect(percentileOfSorted([1, 2, 3, 4, 5], 50)).toBe(3);
    expect(percentileOfSorted([1, 2, 3, 4, 5], 1)).toBeCloseTo(1.04, 12);
    expect(percentileOfSorted([10], 99)).toBe(10);
  });
});
