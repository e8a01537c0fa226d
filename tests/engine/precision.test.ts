import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { roundBode, roundSignificant } from '@/lib/engine/precision';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';

describe('roundSignificant', () => {
  it.each([
    [123456.789, 123457],
    [0.000123456789, 0.000123457],
    [-179.999999, -180],
    [12.3456749, 12.3457],
    [98765432109, 98765400000],
    [1e-30 * 1.23456789, 1.23457e-30],
  ])('%d → %d', (x, want) => {
    expect(roundSignificant(x)).toBe(want);
  });

  it('keeps 0, infinities and NaN', () => {
    expect(roundSignificant(0)).toBe(0);
    expect(roundSignificant(Infinity)).toBe(Infinity);
    expect(Number.isNaN(roundSignificant(NaN))).toBe(true);
  });

  it('prints short and stays within half a unit of the 6th digit', () => {
    for (let i = 0; i < 2000; i++) {
      const x = (Math.random() - 0.5) * 10 ** (Math.random() * 20 - 10);
      const r = roundSignificant(x);
      expect(Math.abs(r - x)).toBeLessThanOrEqual(Math.abs(x) * 5.01e-6);
      expect(String(Math.abs(r)).replace(/e.*$/, '').replace(/^0\.0*/, '').replace('.', '').replace(/0+$/, '').length).toBeLessThanOrEqual(6);
    }
  });
});

describe('roundBode', () => {
  it('cuts the serialised arrays to well under half', () => {
    const { bode } = analyze(SAMPLE_DESIGNS[0].request);
    const full = JSON.stringify(bode).length;
    const rounded = JSON.stringify(roundBode(bode)).length;
    expect(rounded).toBeLessThan(full * 0.5);
  });
});
