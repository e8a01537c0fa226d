import { describe, expect, it } from 'vitest';
import { computeMargins, computeMarginsFromComplex, findCrossings, marginsFromScan, unwrapPhase } from '@/lib/engine/margins';
import { loopChecks } from '@/lib/engine/checks';
import { logSweep, makeGrid, scanTransfer, sweepComplex, transferResponse } from '@/lib/engine/sweep';
import { multiplyTransfers, transferFromPolys, type SectionedTransfer } from '@/lib/engine/transfer';
import { expectAbs, expectRel } from './helpers';

const TWO_PI = 2 * Math.PI;
const integrator = (fiHz: number): SectionedTransfer => ({ gain: TWO_PI * fiHz, originOrder: -1, num: [], den: [] });
const pole = (hz: number) => transferFromPolys([1], [1, 1 / (TWO_PI * hz)]);
const zero = (hz: number) => transferFromPolys([1, 1 / (TWO_PI * hz)], [1]);
const resonance = (hz: number, q: number) => {
  const w = TWO_PI * hz;
  return transferFromPolys([1], [1, 1 / (q * w), 1 / (w * w)]);
};

const marginsOf = (h: SectionedTransfer, fStart = 1, fStop = 1e6, points = 400) => {
  const r = transferResponse(h, logSweep(fStart, fStop, points));
  return { ...r, margins: computeMargins(r.sampled, r.evaluate) };
};

describe('unwrapPhase', () => {
  it('removes 360° jumps and keeps the first sample', () => {
    const truePhase = Array.from({ length: 50 }, (_, i) => -90 - 10 * i);
    const wrapped = truePhase.map((p) => ((((p + 180) % 360) + 360) % 360) - 180);
    expect(unwrapPhase(wrapped)).toEqual(truePhase.map((p) => p + (wrapped[0] - truePhase[0])));
  });
});

describe('reference loops with closed-form margins', () => {
  it('pure integrator: fc = fi, PM = 90°, no GM', () => {
    const { margins } = marginsOf(integrator(2345));
    expectRel(margins.crossoverHz, 2345, 1e-12);
    expectAbs(margins.phaseMarginDeg, 90, 1e-9);
    expect(margins.gainMarginDb).toBeNull();
    expect(margins.phaseCrossoverHz).toBeNull();
  });

  it('integrator and one pole: ω² = p²(√(1 + 4K²/p²) − 1)/2, PM = 90° − atan(ωc/p)', () => {
    const K = TWO_PI * 5e3;
    const p = TWO_PI * 3e3;
    const { margins } = marginsOf(multiplyTransfers({ gain: K, originOrder: -1, num: [], den: [] }, pole(3e3)));
    const wc = Math.sqrt((p * p * (Math.sqrt(1 + (4 * K * K) / (p * p)) - 1)) / 2);
    expectRel(margins.crossoverHz, wc / TWO_PI, 1e-10);
    expectAbs(margins.phaseMarginDeg, 90 - (Math.atan(wc / p) * 180) / Math.PI, 1e-8);
  });

  it('integrator and a double pole: −180° at ω = p, GM = −20·log10(K/(2p))', () => {
    const K = TWO_PI * 2e3;
    const p = 10e3;
    const { margins } = marginsOf(multiplyTransfers({ gain: K, originOrder: -1, num: [], den: [] }, pole(p), pole(p)));
    expectRel(margins.phaseCrossoverHz, p, 1e-10);
    expectAbs(margins.gainMarginDb, -20 * Math.log10(K / (2 * TWO_PI * p)), 1e-8);
  });
});

describe('invariants', () => {
  const loops: [string, SectionedTransfer][] = [
    ['type-II-like', multiplyTransfers(integrator(800), zero(1e3), pole(40e3), resonance(4e3, 3))],
    ['RHP zero', multiplyTransfers(integrator(300), transferFromPolys([1, -1 / (TWO_PI * 50e3)], [1]), resonance(2e3, 1.5), zero(1.5e3))],
    ['steep', multiplyTransfers(integrator(5e3), pole(7e3), pole(9e3))],
  ];

  it.each(loops)('%s: |T(fc)| = 1 within 1e-6 dB and ∠T(f180) = −180° after refinement', (_, h) => {
    const { margins, evaluate } = marginsOf(h);
    expect(margins.crossoverHz).not.toBeNull();
    expect(Math.abs(evaluate(margins.crossoverHz!).magDb)).toBeLessThan(1e-6);
    if (margins.phaseCrossoverHz !== null) expect(Math.abs(evaluate(margins.phaseCrossoverHz).phaseDeg + 180)).toBeLessThan(1e-6);
  });

  it.each(loops)('%s: analytic refinement and sampled interpolation on a fine grid agree', (_, h) => {
    const refined = marginsOf(h).margins;
    const fine = transferResponse(h, logSweep(1, 1e6, 20000));
    const sampled = computeMargins(fine.sampled);
    expectRel(sampled.crossoverHz, refined.crossoverHz!, 1e-4);
    expectAbs(sampled.phaseMarginDeg, refined.phaseMarginDeg!, 0.01);
    if (refined.gainMarginDb !== null) expectAbs(sampled.gainMarginDb, refined.gainMarginDb, 0.01);
    expect(sampled.crossings.map((c) => c.kind + c.direction)).toEqual(refined.crossings.map((c) => c.kind + c.direction));
  });

  it.each([
    ...loops,
    ['conditionally stable', multiplyTransfers(integrator(800e3), resonance(100, 5), zero(1e3), zero(1e3), pole(50e3), pole(50e3))],
    ['resonant re-crossing', multiplyTransfers(integrator(1e3), zero(2e3), resonance(5e3, 20))],
  ] as [string, SectionedTransfer][])('%s: margins from complex samples equal margins from dB/phase samples', (_, h) => {
    const f = logSweep(1, 1e6, 400);
    const { margins, evaluate } = marginsOf(h);
    const c = sweepComplex(h, makeGrid(f));
    const fast = computeMarginsFromComplex(f, c.re, c.im, evaluate);
    expect(fast.crossings.map((x) => x.kind + x.direction)).toEqual(margins.crossings.map((x) => x.kind + x.direction));
    fast.crossings.forEach((x, i) => expectRel(x.hz, margins.crossings[i].hz, 1e-12));
    expectRel(fast.crossoverHz, margins.crossoverHz!, 1e-12);
    expectAbs(fast.phaseMarginDeg, margins.phaseMarginDeg!, 1e-9);
    if (margins.gainMarginDb === null) expect(fast.gainMarginDb).toBeNull();
    else expectAbs(fast.gainMarginDb, margins.gainMarginDb, 1e-9);
    // The engine's scan (no samples formed) finds the same candidates as the complex samples.
    const { scan, evaluate: scanned } = scanTransfer(h, makeGrid(f));
    const viaScan = marginsFromScan(f, scan, scanned);
    expect(viaScan.crossings.map((x) => x.kind + x.direction)).toEqual(fast.crossings.map((x) => x.kind + x.direction));
    viaScan.crossings.forEach((x, i) => expectRel(x.hz, fast.crossings[i].hz, 1e-12));
    expectAbs(viaScan.phaseMarginDeg, fast.phaseMarginDeg!, 1e-9);
  });

  it('the phase of the sweep starts at its principal value (integrator: −90°)', () => {
    const { sampled } = marginsOf(loops[0][1]);
    expectAbs(sampled.phaseDeg[0], -90, 1);
  });
});

describe('special loops', () => {
  it('no crossover: |T| below 0 dB everywhere → fc, PM null', () => {
    const { margins } = marginsOf(multiplyTransfers({ gain: 0.5, originOrder: 0, num: [], den: [] }, pole(10)));
    expect(margins.crossoverHz).toBeNull();
    expect(margins.phaseMarginDeg).toBeNull();
    expect(margins.crossings.filter((c) => c.kind === 'gain')).toEqual([]);
  });

  it('|T| above 0 dB to the end of the sweep → fc null, and the check says the crossover lies above the sweep (and above fsw/2), not "no crossover"', () => {
    const { margins, sampled } = marginsOf(integrator(5e6));
    expect(margins.crossoverHz).toBeNull();
    const end = sampled.f[sampled.f.length - 1];
    // The sweep ends at fsw/2: the crossover lies above fsw/2 too, a risk.
    const atHalf = loopChecks({ margins, loop: sampled, fsw: 2 * end, rhpZeroHz: null });
    expect(atHalf.map((c) => c.id)).not.toContain('no-crossover');
    const above = atHalf.find((c) => c.id === 'crossover-above-sweep');
    expect(above?.level).toBe('risk');
    expect(above?.message).toMatch(/crossover lies above the end of the sweep \(.+\), and so above fsw\/2/);
    // A sweep stopped well below fsw/2: extend it to see the crossover (a caution).
    const short = loopChecks({ margins, loop: sampled, fsw: 10 * end, rhpZeroHz: null });
    expect(short.find((c) => c.id === 'crossover-above-sweep')?.level).toBe('caution');
    expect(short.find((c) => c.id === 'crossover-above-sweep')?.message).toMatch(/Extend the sweep/);
  });

  it('|T| below 0 dB everywhere still reads "no crossover"', () => {
    const { margins, sampled } = marginsOf(multiplyTransfers({ gain: 0.5, originOrder: 0, num: [], den: [] }, pole(10)));
    const checks = loopChecks({ margins, loop: sampled, fsw: 1e6, rhpZeroHz: null });
    expect(checks.find((c) => c.id === 'no-crossover')?.level).toBe('risk');
    expect(checks.map((c) => c.id)).not.toContain('crossover-above-sweep');
  });

  it('multiple crossings: a resonant peak lifts |T| back over 0 dB; fc is the highest downward one', () => {
    // Integrator to 0 dB at 1 kHz, then an undamped-ish LC peak (Q = 20) at 5 kHz.
    const h = multiplyTransfers(integrator(1e3), zero(2e3), resonance(5e3, 20));
    const { margins, sampled } = marginsOf(h);
    const gains = margins.crossings.filter((c) => c.kind === 'gain');
    expect(gains.map((c) => c.direction)).toEqual(['down', 'up', 'down']);
    expect(margins.crossoverHz).toBe(gains[2].hz);
    const checks = loopChecks({ margins, loop: sampled, fsw: 1e6, rhpZeroHz: null });
    expect(checks.map((c) => c.id)).toContain('multiple-crossovers');
  });

  it('conditionally stable loop: phase below −180° under fc with |T| > 0 dB is reported, GM taken above fc only', () => {
    // Integrator, a sharp double pole at 100 Hz (phase → −270°), a double zero at 1 kHz
    // bringing it back to −90°, crossover near 8 kHz, then two poles at 50 kHz.
    const h = multiplyTransfers(integrator(800e3), resonance(100, 5), zero(1e3), zero(1e3), pole(50e3), pole(50e3));
    const { margins, sampled } = marginsOf(h);
    const phase = margins.crossings.filter((c) => c.kind === 'phase');
    expect(phase[0].direction).toBe('down');
    expect(phase[1].direction).toBe('up');
    expect(phase[1].hz).toBeLessThan(margins.crossoverHz!);
    // The GM crossing is the −180° crossing above fc (from the 50 kHz poles), not the low one.
    expect(margins.phaseCrossoverHz!).toBeGreaterThan(margins.crossoverHz!);
    const checks = loopChecks({ margins, loop: sampled, fsw: 1e6, rhpZeroHz: null });
    expect(checks.find((c) => c.id === 'conditional-stability')?.level).toBe('risk');
  });

  it('findCrossings interpolates in log f without an analytic function', () => {
    const f = [10, 100, 1000];
    const y = [20, 0.000001, -20];
    expect(findCrossings(f, y, 0)).toHaveLength(1);
    const c = findCrossings([10, 1000], [20, -20], 0)[0];
    expectRel(c.hz, 100, 1e-12);
    expect(c.direction).toBe('down');
  });
});
