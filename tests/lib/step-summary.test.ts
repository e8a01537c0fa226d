import { describe, expect, it } from 'vitest';
import { describeStep } from '@/lib/step-summary';

describe('describeStep', () => {
  it('names the step with the rise time in SI prefixes', () => {
    expect(describeStep({ kind: 'load', from: 0.5, to: 1, slew: 1e6 })).toBe('load 0.5 → 1 A in 500 ns');
    expect(describeStep({ kind: 'line', from: 12, to: 9, slew: 3e3 })).toBe('line 12 → 9 V in 1 ms');
    expect(describeStep({ kind: 'load', from: 1, to: 2, slew: null })).toBe('load 1 → 2 A, ideal step');
  });
});
