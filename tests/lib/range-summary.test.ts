import { describe, expect, it } from 'vitest';
import { analyzeCorners } from '@/lib/engine/corners';
import { defaultRange } from '@/lib/engine/range';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { summarizeRange, worstCaseSentence } from '@/lib/range-summary';

describe('range summary (Compare, report, mail)', () => {
  const s = SAMPLE_DESIGNS[1];

  it('takes the saved range, or the defaults for a revision without one', () => {
    const r = summarizeRange(s.request);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.range).toEqual(defaultRange(s.request.converter));
    const corners = analyzeCorners(s.request, r.value.range);
    expect(r.value.worst.phaseMarginDeg.value).toBe(corners.worst.phaseMarginDeg.value);
    expect(r.value.worst.phaseMarginDeg.corner).toBe(corners.corners[corners.worst.phaseMarginDeg.corner!].label);
    expect(r.value.spread).toMatchObject({ samples: 2000, seed: 1 });
  });

  it('is the same every time (fixed seed) and reads as one sentence', () => {
    const a = summarizeRange(s.request);
    const b = summarizeRange(s.request);
    expect(a).toEqual(b);
    if (!a.ok) return;
    expect(worstCaseSentence(a.value)).toMatch(/^Worst case over 32 corners: PM \d+\.\d° at .+; GM \d+\.\d dB at .+\. \d+\.\d % of 2,000 simulated builds \(seed 1\) meet PM ≥ 45° and GM ≥ 10 dB\.$/);
  });

  it('says why when the range is impossible', () => {
    const r = summarizeRange({ ...s.request, range: { ...defaultRange(s.request.converter), vin: { min: 3, max: 13 } } });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.message).toMatch(/at the corner high line/);
  });
});
