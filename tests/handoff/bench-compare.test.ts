import { describe, expect, it } from 'vitest';
import { largestDeviation, measureMargins, modelMinusMeasured, unwrapToLoopBranch } from '@/lib/handoff/bench-compare';
import type { BenchPoints } from '@/lib/handoff/bench-parse';

/**
 * Reference loop T(s) = K / (s·(1 + s/ωp)³), sampled like an analyzer would (log-spaced).
 * Exact crossover and margins follow in closed form [D]:
 * |T(jω)| = K / (ω·(1 + (ω/ωp)²)^(3/2)), ∠T = −90° − 3·atan(ω/ωp).
 */
const K = 2 * Math.PI * 1000;
const WP = 2 * Math.PI * 8000;
const magDb = (w: number) => 20 * Math.log10(K / (w * Math.pow(1 + (w / WP) ** 2, 1.5)));
const phaseDeg = (w: number) => -90 - (3 * Math.atan(w / WP) * 180) / Math.PI;

function sample(n: number, f0 = 10, f1 = 1e6): BenchPoints {
  const pts: BenchPoints = { f: [], gainDb: [], phaseDeg: [] };
  for (let k = 0; k < n; k++) {
    const f = f0 * Math.pow(f1 / f0, k / (n - 1));
    pts.f.push(f);
    pts.gainDb.push(magDb(2 * Math.PI * f));
    pts.phaseDeg.push(phaseDeg(2 * Math.PI * f));
  }
  return pts;
}

/** Root of g on [a, b] by bisection. */
function bisect(g: (x: number) => number, a: number, b: number) {
  for (let i = 0; i < 200; i++) {
    const m = (a + b) / 2;
    if (g(a) * g(m) <= 0) b = m;
    else a = m;
  }
  return (a + b) / 2;
}

const fcExact = bisect((f) => magDb(2 * Math.PI * f), 10, 1e6);
const pmExact = 180 + phaseDeg(2 * Math.PI * fcExact);
// −180°: 3·atan(ω/ωp) = 90° → ω = ωp·tan(30°)
const f180 = (WP * Math.tan(Math.PI / 6)) / (2 * Math.PI);
const gmExact = -magDb(2 * Math.PI * f180);

describe('measured margins from sampled bench data', () => {
  it('match the closed form within 0.5 % and 0.2° at 200 points', () => {
    const m = measureMargins(sample(200));
    expect(m.crossoverHz! / fcExact - 1).toBeLessThan(0.005);
    expect(Math.abs(m.phaseMarginDeg! - pmExact)).toBeLessThan(0.2);
    expect(m.phaseCrossoverHz! / f180 - 1).toBeLessThan(0.005);
    expect(Math.abs(m.gainMarginDb! - gmExact)).toBeLessThan(0.05);
    expect(m.gainCrossings).toBe(1);
  });

  it('do not care how the phase was wrapped', () => {
    const pts = sample(200);
    const wrapped = { ...pts, phaseDeg: pts.phaseDeg.map((p) => (p < -180 ? p + 360 : p)) };
    const plus360 = { ...pts, phaseDeg: pts.phaseDeg.map((p) => p + 360) };
    const a = measureMargins(pts);
    expect(measureMargins(wrapped)).toEqual(a);
    expect(measureMargins(plus360).phaseMarginDeg).toBeCloseTo(a.phaseMarginDeg!, 9);
  });

  it('are null when the gain never crosses 0 dB or the phase never reaches −180°', () => {
    const m = measureMargins({ f: [10, 100, 1000], gainDb: [40, 30, 20], phaseDeg: [-90, -100, -120] });
    expect(m.crossoverHz).toBeNull();
    expect(m.phaseMarginDeg).toBeNull();
    expect(m.gainMarginDb).toBeNull();
    expect(m.gainCrossings).toBe(0);
  });

  it('unwrap keeps the lowest point in (−270°, 90°]', () => {
    expect(unwrapToLoopBranch([170, -170, -150])).toEqual([-190, -170, -150]);
    expect(unwrapToLoopBranch([-90 + 720, -100 + 720])).toEqual([-90, -100]);
  });
});

describe('model minus measured', () => {
  it('is zero where the model and the bench agree', () => {
    const model = sample(400, 1, 1e7);
    const bench = sample(120);
    const d = modelMinusMeasured({ f: model.f, magDb: model.gainDb, phaseDeg: model.phaseDeg }, bench);
    expect(d.f.length).toBe(120);
    expect(largestDeviation(d.gainDb)!).toBeLessThan(0.05);
    expect(largestDeviation(d.phaseDeg)!).toBeLessThan(0.1);
  });

  it('shows an offset, wraps the phase and leaves out points outside the sweep', () => {
    const model = { f: [100, 1000, 10000], magDb: [20, 0, -20], phaseDeg: [-170, -175, -185] };
    const bench = { f: [10, 100, 1000, 5000, 1e5], gainDb: [30, 18, -1, -10, -40], phaseDeg: [-90, 175, 180, -180, -200] };
    const d = modelMinusMeasured(model, bench);
    expect(d.f).toEqual([100, 1000, 5000]);
    expect(d.gainDb[0]).toBeCloseTo(2, 9);
    expect(d.gainDb[1]).toBeCloseTo(1, 9);
    expect(d.phaseDeg[0]).toBeCloseTo(15, 9); // −170 − 175 = −345 → +15
    expect(d.phaseDeg[1]).toBeCloseTo(5, 9);
    expect(largestDeviation([])).toBeNull();
  });
});
