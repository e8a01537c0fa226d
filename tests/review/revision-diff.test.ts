import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { diffRevisions, marginDeltas, sameValue, type RevisionSide } from '@/lib/revision-diff';
import { summarizeAnalysis } from '@/lib/revision-summary';
import { formatChange, formatValue } from '@/components/review/format';

const side = (input: AnalyzeRequest): RevisionSide => ({ input, summary: summarizeAnalysis(analyze(input)) });
const type3 = SAMPLE_DESIGNS.find((s) => s.request.compensator.type === 'type3')!.request;
const type2 = SAMPLE_DESIGNS.find((s) => s.request.compensator.type === 'type2')!.request;

describe('diffRevisions', () => {
  it('marks nothing when both sides are the same design', () => {
    const rows = diffRevisions(side(type3), side(type3));
    expect(rows.filter((r) => r.changed)).toEqual([]);
    expect(rows.map((r) => r.group)).toEqual(expect.arrayContaining(['Power stage', 'Compensator', 'Parts', 'Margins', 'Operating point']));
  });

  it('marks the edited part, the parts and margins it moves, and nothing in the power stage', () => {
    const edited = { ...type3, compensator: { ...type3.compensator, r2: type3.compensator.r2! * 2 } };
    const rows = diffRevisions(side(type3), side(edited));
    const changed = new Set(rows.filter((r) => r.changed).map((r) => r.key));
    expect(changed.has('comp.r2')).toBe(true);
    expect(changed.has('part.r2')).toBe(true);
    expect(changed.has('fc')).toBe(true);
    expect(changed.has('pm')).toBe(true);
    for (const key of ['vin', 'vout', 'l', 'c', 'comp.r1', 'comp.c1', 'type']) expect(changed.has(key), key).toBe(false);
  });

  it('lists parts only one side uses (Type II → Type III) as changed from nothing', () => {
    const stage = { ...type3, compensator: type2.compensator };
    const rows = diffRevisions(side(stage), side(type3));
    const r3 = rows.find((r) => r.key === 'comp.r3')!;
    expect(r3).toMatchObject({ a: null, b: type3.compensator.r3, changed: true });
    expect(rows.find((r) => r.key === 'type')).toMatchObject({ a: 'Type II', b: 'Type III', changed: true });
  });
});

describe('marginDeltas', () => {
  it('gives B − A for fc, PM and GM', () => {
    const a = side(type3);
    const b = side({ ...type3, compensator: { ...type3.compensator, r2: type3.compensator.r2! * 1.5 } });
    const [fc, pm] = marginDeltas(a, b);
    expect(fc.delta).toBeCloseTo(b.summary.margins.crossoverHz! - a.summary.margins.crossoverHz!, 6);
    expect(pm.delta).toBeCloseTo(b.summary.margins.phaseMarginDeg! - a.summary.margins.phaseMarginDeg!, 6);
    expect(fc.delta).toBeGreaterThan(0); // more mid-band gain pushes fc up
  });
});

describe('formatting', () => {
  it('reads values with SI prefixes, degrees, dB and %', () => {
    expect(formatValue('si', 22e3, 'Ω')).toBe('22 kΩ');
    expect(formatValue('deg', 52.345)).toBe('52.3°');
    expect(formatValue('db', -12)).toBe('-12.0 dB');
    expect(formatValue('percent', 0.2083)).toBe('20.8 %');
    expect(formatValue('si', null, 'F')).toBe('—');
  });

  it('reads changes: relative for SI, absolute for degrees and dB', () => {
    expect(formatChange('si', 10e3, 15e3, 'Ω')).toBe('+50.0 %');
    expect(formatChange('deg', 60, 48.5)).toBe('−11.5°');
    expect(formatChange('db', 8, 10)).toBe('+2.0 dB');
    expect(formatChange('text', 'E24', 'E96')).toBe('E24 → E96');
    expect(formatChange('si', null, 1e-9, 'F')).toBe('added');
    expect(formatChange('si', 0, 0.3, 'V')).toBe('0 V → 300 mV');
  });

  it('counts numbers equal within a relative 1e-9', () => {
    expect(sameValue(1.0000000001, 1)).toBe(true);
    expect(sameValue(1.001, 1)).toBe(false);
    expect(sameValue(null, null)).toBe(true);
    expect(sameValue('a', 'b')).toBe(false);
  });
});
