import { describe, expect, it } from 'vitest';
import { clipBenchToSweep, sweepCovering } from '@/components/tune/sweep-range';

const bench = { f: [5, 100, 1e3, 1e4, 2e5, 4e5], gainDb: [40, 30, 20, 0, -20, -30], phaseDeg: [-90, -95, -100, -120, -160, -170], name: 'lab' };

describe('bench data against the sweep', () => {
  it('clips bench points outside the sweep and counts them on each side', () => {
    const r = clipBenchToSweep(bench, { fStart: 10, fStop: 175e3, points: 400 });
    expect(r.below).toBe(1);
    expect(r.above).toBe(2);
    expect(r.shown!.f).toEqual([100, 1e3, 1e4]);
    expect(r.shown!.gainDb).toEqual([30, 20, 0]);
    expect(r.shown!.phaseDeg).toEqual([-95, -100, -120]);
    expect(r.shown!.name).toBe('lab');
  });

  it('leaves bench data inside the sweep as it is', () => {
    const r = clipBenchToSweep(bench, { fStart: 1, fStop: 1e6, points: 400 });
    expect(r.shown).toBe(bench);
    expect(r.below + r.above).toBe(0);
  });

  it('widens the sweep to cover the bench data, keeping the points per decade', () => {
    const s = sweepCovering({ fStart: 10, fStop: 100e3, points: 401 }, bench);
    expect(s.fStart).toBe(5);
    expect(s.fStop).toBe(4e5);
    // 100 points per decade over log10(4e5/5) = 4.9 decades
    expect(s.points).toBe(Math.ceil(100 * Math.log10(4e5 / 5)) + 1);
  });
});
