/**
 * Rounding of results to the precision the data has.
 *
 * The model's inputs (part tolerances of 1 % at best, an averaged small-signal model) carry
 * far fewer than the 17 significant digits a double prints with; 6 significant digits keep
 * every plotted or compared value exact to 1 ppm and cut the serialised Bode arrays to about
 * a third.
 */
import type { BodeData, BodeTrace } from './types';

/** Significant digits of the Bode arrays in the API's answer. */
export const BODE_SIGNIFICANT_DIGITS = 6;

// Exact powers of ten (10^0 … 10^22 are exactly representable doubles).
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * x rounded to `digits` significant digits (half away from zero for positives, half up for
 * negatives). Dividing an integer by an exact power of ten is correctly rounded, so the
 * result prints as the short decimal; 0, ±Infinity and NaN come back unchanged.
 */
export function roundSignificant(x: number, digits = BODE_SIGNIFICANT_DIGITS): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  const decimals = digits - 1 - Math.floor(Math.log10(Math.abs(x)));
  if (decimals >= 0 && decimals < POW10.length) return Math.round(x * POW10[decimals]) / POW10[decimals];
  if (decimals < 0 && -decimals < POW10.length) return Math.round(x / POW10[-decimals]) * POW10[-decimals];
  return Number(x.toPrecision(digits));
}

const roundArray = (a: number[], digits: number) => {
  const out = new Array<number>(a.length);
  for (let i = 0; i < a.length; i++) out[i] = roundSignificant(a[i], digits);
  return out;
};

const roundTrace = (t: BodeTrace, digits: number): BodeTrace => ({
  magDb: roundArray(t.magDb, digits),
  phaseDeg: roundArray(t.phaseDeg, digits),
});

/** Every array of a Bode result rounded to `digits` significant digits (a new object). */
export function roundBode(bode: BodeData, digits = BODE_SIGNIFICANT_DIGITS): BodeData {
  return {
    f: roundArray(bode.f, digits),
    loop: roundTrace(bode.loop, digits),
    plant: roundTrace(bode.plant, digits),
    compensator: roundTrace(bode.compensator, digits),
  };
}
