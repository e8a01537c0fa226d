import { describe, expect, it } from 'vitest';
import { formatSi, parseSi } from '@/lib/units/si';

describe('parseSi', () => {
  it.each([
    ['4.7u', 4.7e-6],
    ['4.7µ', 4.7e-6],
    ['4.7μ', 4.7e-6],
    ['22k', 22e3],
    ['22K', 22e3],
    ['1n5', 1.5e-9],
    ['1.5e-9', 1.5e-9],
    ['2M2', 2.2e6],
    ['100m', 0.1],
    ['10meg', 10e6],
    ['4R7', 4.7],
    ['4.7uH', 4.7e-6],
    ['22kΩ', 22e3],
    ['48kHz', 48e3],
    ['10 ohm', 10],
    ['1mH', 1e-3],
    ['1F', 1],
    ['1fF', 1e-15],
    ['  3.3 V ', 3.3],
    ['-12', -12],
    ['.5', 0.5],
  ])('%s → %s', (text, value) => {
    expect(parseSi(text)).toBe(value);
  });

  it.each(['', 'abc', '1.5k7', '1e3k5', '4.7x', '1..2', 'k', '12 VV', '5a'])('rejects %j', (text) => {
    expect(parseSi(text)).toBeNull();
  });
});

describe('formatSi', () => {
  it.each([
    [4.7e-6, 'H', '4.7 µH'],
    [22e3, 'Ω', '22 kΩ'],
    [1.5e-9, 'F', '1.5 nF'],
    [48e3, 'Hz', '48 kHz'],
    [0.1, 'V', '100 mV'],
    [999.96, 'Hz', '1 kHz'],
    [123456, 'Hz', '123 kHz'],
    [-0.0047, 'A', '-4.7 mA'],
    [0, 'F', '0 F'],
    [12, 'V', '12 V'],
  ])('%s %s → %s', (value, unit, text) => {
    expect(formatSi(value, unit)).toBe(text);
  });

  it('keeps the requested significant digits and round-trips through parseSi', () => {
    expect(formatSi(2652.6, 'Ω', 4)).toBe('2.653 kΩ');
    for (const v of [4.7e-6, 22e3, 1.5e-9, 3.3, 150e3]) expect(parseSi(formatSi(v, 'F').replace(' ', ''))).toBeCloseTo(v, 15);
    expect(formatSi(Number.NaN)).toBe('—');
  });

  it('rounds as Number.prototype.toPrecision does (ECMA-262 §21.1.3.5), ties and powers of ten included', () => {
    // The definition formatSi had before its arithmetic fast path, kept here as the reference.
    const prefixes: [number, string][] = [[12, 'T'], [9, 'G'], [6, 'M'], [3, 'k'], [0, ''], [-3, 'm'], [-6, 'µ'], [-9, 'n'], [-12, 'p'], [-15, 'f']];
    const reference = (value: number, unit: string, digits: number) => {
      const rounded = Number(value.toPrecision(digits));
      const exp = Math.floor(Math.log10(Math.abs(rounded)));
      const [e, prefix] = exp > 14 ? prefixes[0] : (prefixes.find(([x]) => exp >= x) ?? prefixes[prefixes.length - 1]);
      return `${Number((rounded / Math.pow(10, e)).toPrecision(digits))} ${prefix}${unit}`.trim();
    };
    const values: number[] = [];
    for (let e = -20; e <= 20; e++)
      for (const m of [1, 2.2, 4.7, 9.995, 9.9949, 999.5, 0.5, 1.005, 1.015, 2.675, 10, 999.4999]) values.push(m * 10 ** e, -m * 10 ** e);
    let seed = 7;
    const random = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let i = 0; i < 20000; i++) values.push((random() < 0.5 ? -1 : 1) * Math.exp((random() - 0.5) * 90));
    for (const v of values) for (const d of [2, 3, 4]) expect(formatSi(v, 'Hz', d)).toBe(reference(v, 'Hz', d));
  });
});
