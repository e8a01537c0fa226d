import { describe, expect, it } from 'vitest';
import { seriesValues, snapToSeries } from '@/lib/engine/eseries';
import { E_SERIES_NAMES } from '@/lib/engine/types';

// IEC 60063:2015 Table 1 (E6–E24); lists as in CHECK-VALUES §1 (from memory, cross-checked).
const IEC_E6 = [1.0, 1.5, 2.2, 3.3, 4.7, 6.8];
const IEC_E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];
const IEC_E24 = [1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1];

describe('IEC 60063 preferred values', () => {
  it('E6, E12, E24 are the standard two-digit tables', () => {
    expect(seriesValues('E6')).toEqual(IEC_E6);
    expect(seriesValues('E12')).toEqual(IEC_E12);
    expect(seriesValues('E24')).toEqual(IEC_E24);
  });

  it('E24 differs from the rounded geometric series at exactly the eight known entries', () => {
    const formula = Array.from({ length: 24 }, (_, k) => Math.round(10 ** (k / 24) * 10) / 10);
    const diff = IEC_E24.filter((v, k) => v !== formula[k]);
    expect(diff).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });

  it('E48, E96, E192 have 48, 96, 192 three-digit values; E48 is every second E96 (IEC 60063 Table 2)', () => {
    expect(seriesValues('E48')).toHaveLength(48);
    expect(seriesValues('E96')).toHaveLength(96);
    expect(seriesValues('E192')).toHaveLength(192);
    expect(seriesValues('E48')).toEqual(seriesValues('E96').filter((_, k) => k % 2 === 0));
    expect(seriesValues('E96').slice(0, 6)).toEqual([1.0, 1.02, 1.05, 1.07, 1.1, 1.13]);
    expect(seriesValues('E96')[95]).toBe(9.76);
  });

  it('E192 k = 185 is 9.20, not the formula value 9.19 (the one exception, from memory)', () => {
    expect(seriesValues('E192')[185]).toBe(9.2);
    expect(Math.round(10 ** (185 / 192) * 100) / 100).toBe(9.19);
    expect(seriesValues('E192')[184]).toBe(9.09);
    expect(seriesValues('E192')[186]).toBe(9.31);
  });

  it('every series is ascending within [1, 10)', () => {
    for (const name of E_SERIES_NAMES) {
      const v = seriesValues(name);
      v.forEach((x, i) => {
        expect(x).toBeGreaterThanOrEqual(1);
        expect(x).toBeLessThan(10);
        if (i > 0) expect(x).toBeGreaterThan(v[i - 1]);
      });
    }
  });
});

describe('snapToSeries: nearest in log distance', () => {
  // CHECK-VALUES §1 nearest-in-log examples (computed from the tables).
  it.each([
    [2652.6, 'E96', 2670],
    [2652.6, 'E48', 2610],
    [3690.8, 'E6', 3300],
    [3690.8, 'E12', 3900],
    [3690.8, 'E24', 3600],
    [194.7, 'E6', 220],
    [194.7, 'E12', 180],
  ] as const)('%s in %s → %s', (value, series, expected) => {
    expect(snapToSeries(value, series)).toBeCloseTo(expected, 9);
  });

  it('crosses decades (9.7 nF → 10 nF in E12) and keeps the scale of tiny values', () => {
    expect(snapToSeries(9.7e-9, 'E12')).toBeCloseTo(10e-9, 20);
    expect(snapToSeries(4.6e-12, 'E12')).toBe(4.7e-12);
    expect(snapToSeries(1.04e6, 'E6')).toBe(1e6);
  });

  it('is idempotent and never moves a value by more than half a series step (log)', () => {
    for (const name of E_SERIES_NAMES) {
      const n = seriesValues(name).length;
      for (let x = 1.001; x < 1000; x *= 1.137) {
        const s = snapToSeries(x, name);
        expect(snapToSeries(s, name)).toBe(s);
        // Steps of the hard-coded series are uneven; allow a 40 % wider half-step.
        expect(Math.abs(Math.log10(s / x))).toBeLessThanOrEqual((0.5 / n) * 1.4);
      }
    }
  });
});
