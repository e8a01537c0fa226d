import { describe, expect, it } from 'vitest';
import { summarizeCompensator } from '@/lib/engine/compensator';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { computeGeometry, plotMargin } from '@/components/plot/geometry';
import { computeRanges } from '@/components/plot/bode-traces';
import { compensatorFromShape, gainHandleHz, handlesOf, moveFrequency, shapeFromParts, shiftGain } from '@/components/tune/handles';

const samples = SAMPLE_DESIGNS.map((s) => s.request.compensator);
const midband = (shape: ReturnType<typeof shapeFromParts>) => {
  const r = compensatorFromShape(shape);
  if (!r.ok) throw new Error(r.issues[0].message);
  return summarizeCompensator(r.comp).midbandGainDb!;
};

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

  it('moves a zero to the frequency asked and holds the mid-band gain', () => {
    for (const comp of samples) {
      const shape = shapeFromParts(comp);
      const moved = moveFrequency(shape, 'z0', shape.zerosHz[0] * 0.6);
      expect(moved.zerosHz[0]).toBeCloseTo(shape.zerosHz[0] * 0.6, 9);
      expect(midband(moved)).toBeCloseTo(midband(shape), 9);
    }
  });

  it('shifts the mid-band gain by exactly the dB asked (Gc is proportional to the integrator frequency)', () => {
    for (const comp of samples) {
      const shape = shapeFromParts(comp);
      expect(midband(shiftGain(shape, 3.5)) - midband(shape)).toBeCloseTo(3.5, 9);
      expect(midband(shiftGain(shape, -6)) - midband(shape)).toBeCloseTo(-6, 9);
    }
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
