import { describe, expect, it } from 'vitest';
import { compensatorTransfer } from '@/lib/engine/compensator';
import { analyzeLoop, preparePlant } from '@/lib/engine/analyze';
import { interpolateLogF } from '@/lib/engine/margins';
import { transferEvaluator } from '@/lib/engine/sweep';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { CompensatorShape } from '@/lib/engine/types';
import { parseSi, formatSi } from '@/lib/units/si';
import { computeGeometry, plotMargin } from '@/components/plot/geometry';
import { computeRanges } from '@/components/plot/bode-traces';
import {
  compensatorFromShape,
  compensatorGainDbAt,
  dragShape,
  gainHandleHz,
  handlesOf,
  moveFrequency,
  setGainAt,
  shapeFromParts,
  shiftGain,
  withPart,
} from '@/components/tune/handles';

const samples = SAMPLE_DESIGNS.map((s) => s.request.compensator);
const gcDb = (shape: CompensatorShape, hz: number) => {
  const r = compensatorFromShape(shape);
  if (!r.ok) throw new Error(r.issues[0].message);
  return transferEvaluator(compensatorTransfer(r.comp), hz)(hz).magDb;
};
const ids = (shape: CompensatorShape) => [...shape.zerosHz.map((_, i) => `z${i}`), ...shape.polesHz.map((_, i) => `p${i}`)];
const hzOf = (shape: CompensatorShape, id: string) => (id.startsWith('z') ? shape.zerosHz : shape.polesHz)[Number(id.slice(1))];
const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('compensator handles', () => {
  it('lists a handle per zero and pole plus the gain handle', () => {
    for (const comp of samples) {
      const shape = shapeFromParts(comp);
      const handles = handlesOf(shape, null);
      expect(handles.filter((h) => h.kind === 'zero')).toHaveLength(shape.zerosHz.length);
      expect(handles.filter((h) => h.kind === 'pole')).toHaveLength(shape.polesHz.length);
      expect(handles.filter((h) => h.kind === 'gain')).toHaveLength(1);
    }
  });

  // Straight-line Bode plot (any control text, e.g. Erickson & Maksimović, Fundamentals of Power
  // Electronics, 2nd ed., §8.1): below a zero or pole the curve follows the terms beneath it only.
  it('moves a zero or pole on its far side only: the integrator and the curve below it stay, the curve above moves by the ratio', () => {
    for (const comp of samples) {
      const shape = shapeFromParts(comp);
      for (const id of ids(shape)) {
        for (const ratio of [0.5, 2]) {
          const old = hzOf(shape, id);
          const moved = moveFrequency(shape, id, old * ratio);
          if (!compensatorFromShape(moved).ok) continue; // a pole pushed below its zero is refused (below)
          expect(hzOf(moved, id)).toBe(old * ratio);
          expect(moved.integratorHz).toBe(shape.integratorHz);
          const low = Math.min(old, old * ratio, ...shape.zerosHz, ...shape.polesHz) / 1000;
          expect(Math.abs(gcDb(moved, low) - gcDb(shape, low))).toBeLessThan(0.01);
          const high = Math.max(old, old * ratio, ...shape.zerosHz, ...shape.polesHz) * 1000;
          const expected = (id.startsWith('z') ? -1 : 1) * 20 * Math.log10(ratio);
          expect(gcDb(moved, high) - gcDb(shape, high)).toBeCloseTo(expected, 2);
        }
      }
    }
  });

  it('a Type III R3·C3 pole moved down lowers the gain above it and so the crossover (it never raises it)', () => {
    const design = SAMPLE_DESIGNS.find((s) => s.request.compensator.type === 'type3')!;
    const prepared = preparePlant(design.request);
    const shape = shapeFromParts(design.request.compensator);
    const last = `p${shape.polesHz.length - 1}`;
    const moved = moveFrequency(shape, last, hzOf(shape, last) * 0.43);
    const r = compensatorFromShape(moved);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const before = analyzeLoop(prepared, design.request.compensator).margins.crossoverHz!;
    const after = analyzeLoop(prepared, r.comp).margins.crossoverHz!;
    expect(after).toBeLessThan(before);
  });

  it('shifts the whole curve by exactly the dB asked (Gc is proportional to the integrator frequency)', () => {
    for (const comp of samples) {
      const shape = shapeFromParts(comp);
      for (const hz of [100, 5e3, 1e5]) {
        expect(gcDb(shiftGain(shape, 3.5), hz) - gcDb(shape, hz)).toBeCloseTo(3.5, 9);
        expect(gcDb(shiftGain(shape, -6), hz) - gcDb(shape, hz)).toBeCloseTo(-6, 9);
      }
    }
  });

  it('reads the gain handle as |Gc| at its own frequency, the number the compensator curve shows there', () => {
    for (const design of SAMPLE_DESIGNS) {
      const prepared = preparePlant(design.request);
      const loop = analyzeLoop(prepared, design.request.compensator);
      const shape = shapeFromParts(design.request.compensator);
      const gain = handlesOf(shape, prepared.plant.resonanceHz).find((h) => h.kind === 'gain')!;
      const onCurve = interpolateLogF(loop.bode.f, loop.bode.compensator.magDb, gain.hz);
      expect(Math.abs(compensatorGainDbAt(shape, gain.hz)! - onCurve)).toBeLessThan(0.05);
      const set = setGainAt(shape, gain.hz, -20)!;
      expect(compensatorGainDbAt(set, gain.hz)).toBeCloseTo(-20, 9);
    }
  });

  it('keeps a Type I gain handle at its anchor, so a gain change moves it only up or down', () => {
    const shape: CompensatorShape = { type: 'type1', r1: 10e3, integratorHz: 500, zerosHz: [], polesHz: [] };
    expect(gainHandleHz(shape, 2e3)).toBe(2e3);
    expect(gainHandleHz(shiftGain(shape, 6), 2e3)).toBe(2e3);
  });

  it('reverses drags exactly: +25 px, −50 px, +25 px return every handle to the start', () => {
    const scale = { pxPerDecade: 187.3, pxPerDb: 2.71 };
    for (const comp of samples) {
      const shape = shapeFromParts(comp);
      for (const id of [...ids(shape), 'gain']) {
        const dx = id === 'gain' ? 0 : 1;
        const dy = id === 'gain' ? 1 : 0;
        let s = shape;
        for (const step of [25, -50, 25]) s = dragShape(s, id, dx * step, dy * step, scale);
        expect(rel(s.integratorHz, shape.integratorHz)).toBeLessThan(1e-13);
        s.zerosHz.forEach((z, i) => expect(rel(z, shape.zerosHz[i])).toBeLessThan(1e-13));
        s.polesHz.forEach((p, i) => expect(rel(p, shape.polesHz[i])).toBeLessThan(1e-13));
        expect(formatSi(s.integratorHz, 'Hz', 6)).toBe(formatSi(shape.integratorHz, 'Hz', 6));
      }
    }
  });

  it('moves a drag by the pointer offset only: 25 px at 2.71 px/dB is 9.225 dB, 50 px at 100 px/decade is √10', () => {
    const shape = shapeFromParts(samples[1]);
    const scale = { pxPerDecade: 100, pxPerDb: 2.71 };
    expect(gcDb(dragShape(shape, 'gain', 0, -25, scale), 1e3) - gcDb(shape, 1e3)).toBeCloseTo(25 / 2.71, 9);
    expect(dragShape(shape, 'z0', 50, 0, scale).zerosHz[0] / shape.zerosHz[0]).toBeCloseTo(Math.sqrt(10), 12);
  });

  it('refuses a pole dragged below its zero, naming why', () => {
    const shape = shapeFromParts(samples[1]); // Type II
    const r = compensatorFromShape(moveFrequency(shape, 'p0', shape.zerosHz[0] / 2));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].message).toMatch(/pole must sit above/);
  });

  it('puts the gain handle between the top zero and the first pole above it', () => {
    const shape = shapeFromParts(samples[1]);
    const hz = gainHandleHz(shape, null);
    expect(hz).toBeGreaterThan(shape.zerosHz[0]);
    expect(hz).toBeLessThan(shape.polesHz[0]);
  });
});

describe('parts both ways', () => {
  it('a typed part value moves the poles and zeros it sets (C1 = 4.7n: the R2·C1 zero at 1/(2π·R2·4.7 nF))', () => {
    const comp = samples[1]; // Type II
    const r = withPart(comp, 'c1', parseSi('4.7n')!);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const shape = shapeFromParts(r.comp);
    expect(r.comp.c1).toBe(4.7e-9);
    expect(shape.zerosHz[0]).toBeCloseTo(1 / (2 * Math.PI * comp.r2! * 4.7e-9), 6);
    expect(shape.integratorHz).toBeCloseTo(1 / (2 * Math.PI * comp.r1 * (4.7e-9 + comp.c2!)), 6);
  });

  it('refuses a part the type does not have, a negative C2 and a zero resistor, naming the part', () => {
    const r1 = withPart(samples[1], 'r3', 1e3);
    expect(r1.ok || r1.message).toMatch(/R3 is not a part/);
    const r2 = withPart(samples[1], 'c2', -1e-12);
    expect(r2.ok || r2.message).toMatch(/C2 cannot be negative/);
    const r3 = withPart(samples[0], 'r2', 0);
    expect(r3.ok || r3.message).toMatch(/R2 must be above 0/);
  });

  it('a locked part keeps its value while the handles move the others; the shape is the one asked for', () => {
    for (const comp of samples) {
      for (const part of ['c1', 'r2'] as const) {
        const value = part === 'c1' ? 4.7e-9 : 22e3;
        const start = withPart(comp, part, value);
        if (!start.ok) throw new Error(start.message);
        const shape = shapeFromParts(start.comp);
        const target = shiftGain(moveFrequency(shape, 'z0', shape.zerosHz[0] * 0.7), 2);
        const r = compensatorFromShape(target, { part, value });
        expect(r.ok).toBe(true);
        if (!r.ok) continue;
        expect(r.comp[part]).toBe(value);
        const got = shapeFromParts(r.comp);
        expect(rel(got.integratorHz, target.integratorHz)).toBeLessThan(1e-12);
        got.zerosHz.forEach((z, i) => expect(rel(z, target.zerosHz[i])).toBeLessThan(1e-12));
        got.polesHz.forEach((p, i) => expect(rel(p, target.polesHz[i])).toBeLessThan(1e-12));
        expect(r.comp.r1).not.toBe(comp.r1); // the impedance level moved to hold the locked part
      }
    }
  });
});

describe('plot geometry', () => {
  it('maps frequency and dB to pixels and back', () => {
    const f = [10, 100, 1e3, 1e4, 1e5];
    const ranges = computeRanges({ f, series: [{ id: 'a', name: 'a', color: '#000', magDb: [40, 20, 0, -20, -40], phaseDeg: [-90, -90, -120, -150, -170] }] });
    expect(ranges.x).toEqual([1, 5]);
    expect(ranges.mag[0]).toBeLessThan(-40);
    expect(ranges.mag[1]).toBeGreaterThan(40);
    expect(ranges.phase[0]).toBeLessThan(-180);
    const g = computeGeometry(900, 480, ranges, plotMargin(false));
    expect(g.hzToX(10)).toBeCloseTo(g.left, 9);
    expect(g.hzToX(1e5)).toBeCloseTo(g.right, 9);
    expect(g.xToHz(g.hzToX(3300))).toBeCloseTo(3300, 6);
    expect(g.yToDb(g.dbToY(-12.5))).toBeCloseTo(-12.5, 9);
    expect(g.dbToY(ranges.mag[1])).toBeCloseTo(g.magTop, 9);
  });
});

describe('handle labels around a transconductance amplifier', () => {
  it('name the gm gain and the divider-loaded feed-forward pole (lib/engine/compensator.ts module header)', () => {
    const shape = shapeFromParts({ type: 'type3', amplifier: 'transconductance', gm: 1e-3, r1: 10e3, rb: 2.5e3, r2: 20e3, c1: 4.7e-9, c2: 100e-12, r3: 1e3, c3: 1e-9 });
    const hs = handlesOf(shape, null);
    expect(hs.find((h) => h.id === 'gain')?.parts).toContain('gm·Rb');
    expect(hs.find((h) => h.id === 'p1')?.parts).toBe('(R3+R1∥Rb)·C3');
    const op = handlesOf(shapeFromParts({ type: 'type3', r1: 10e3, r2: 20e3, c1: 4.7e-9, c2: 100e-12, r3: 1e3, c3: 1e-9 }), null);
    expect(op.find((h) => h.id === 'gain')?.parts).toContain('R1·(C1+C2)');
    expect(op.find((h) => h.id === 'p1')?.parts).toBe('R3·C3');
  });
});
