import { describe, expect, it } from 'vitest';
import { formatChange, formatMarginDelta, signed } from '@/components/review/format';

describe('changes on Compare never read −0.0', () => {
  it('rounds before choosing the sign', () => {
    expect(signed(-0.04, 1)).toBe('±0.0');
    expect(signed(0.04, 1)).toBe('±0.0');
    expect(signed(-0.05, 1)).toBe('−0.1');
    expect(signed(1.26, 1)).toBe('+1.3');
  });

  it('a phase margin that moved by −0.03° reads ±0.0°', () => {
    expect(formatMarginDelta({ key: 'pm', a: 54.95, b: 54.92, delta: 54.92 - 54.95 })).toBe('±0.0°');
    expect(formatMarginDelta({ key: 'gm', a: 12.01, b: 11.99, delta: 11.99 - 12.01 })).toBe('±0.0 dB');
    expect(formatMarginDelta({ key: 'pm', a: 50, b: 45.2, delta: -4.8 })).toBe('−4.8°');
  });

  it('the difference table rounds the same way', () => {
    expect(formatChange('deg', 54.95, 54.92)).toBe('±0.0°');
    expect(formatChange('db', 3, 2.97)).toBe('±0.0 dB');
    expect(formatChange('si', 1000, 999.9996, 'Ω')).toBe('±0.0 %');
    expect(formatChange('deg', 40, 45.5)).toBe('+5.5°');
  });

  it('a crossover change keeps its sign with the percentage rounded as shown', () => {
    expect(formatMarginDelta({ key: 'fc', a: 10e3, b: 10.002e3, delta: 2 })).toMatch(/^\+2(\.00)? Hz \(±0 %\)$/);
    expect(formatMarginDelta({ key: 'fc', a: 10e3, b: 8e3, delta: -2e3 })).toMatch(/^−2(\.00)? kHz \(−20 %\)$/);
  });
});
