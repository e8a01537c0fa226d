/** Shared helpers for the engine tests. */
import { expect } from 'vitest';
import type { AnalyzeRequest } from '@/lib/engine/types';

/** |actual − expected| ≤ rel·|expected|. */
export const expectRel = (actual: number | null | undefined, expected: number, rel: number, what = '') => {
  expect(actual, what).not.toBeNull();
  expect(actual, what).toBeDefined();
  const err = Math.abs((actual as number) - expected) / Math.abs(expected);
  expect(err, `${what}: ${actual} vs ${expected} (relative error ${err.toExponential(2)} > ${rel})`).toBeLessThanOrEqual(rel);
};

/** |actual − expected| ≤ tol. */
export const expectAbs = (actual: number | null | undefined, expected: number, tol: number, what = '') => {
  expect(actual, what).not.toBeNull();
  const err = Math.abs((actual as number) - expected);
  expect(err, `${what}: ${actual} vs ${expected} (error ${err.toExponential(2)} > ${tol})`).toBeLessThanOrEqual(tol);
};

/**
 * A value printed in a reference with limited digits: agree to half a unit of the last printed
 * digit (e.g. '42.645' → ±0.0005), then scaled by `unit` (e.g. 1e-12 for pF).
 */
export const expectPrinted = (actual: number, printed: string, unit = 1, what = '') => {
  const decimals = printed.includes('.') ? printed.split('.')[1].length : 0;
  const tol = 0.5 * Math.pow(10, -decimals) * unit;
  expectAbs(actual, Number(printed) * unit, tol * (1 + 1e-9), what || printed);
};

/** A plain request for tests; override any part. */
export type RequestOverrides = Partial<Omit<AnalyzeRequest, 'converter'>> & { converter?: Partial<AnalyzeRequest['converter']> };

export const makeRequest = (over: RequestOverrides = {}): AnalyzeRequest => ({
  modulator: { vramp: 1 },
  feedback: { vref: 0.8 },
  compensator: { type: 'type2', r1: 10e3, r2: 20e3, c1: 10e-9, c2: 100e-12 },
  ...over,
  converter: {
    topology: 'buck',
    vin: 12,
    vout: 3.3,
    iout: 2,
    fsw: 500e3,
    l: 4.7e-6,
    rl: 0.01,
    c: 47e-6,
    rc: 0.005,
    vd: 0,
    ...over.converter,
  },
});
