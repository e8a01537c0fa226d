/** Validation messages and the range form name each input as the catalogue does. */
import { describe, expect, it } from 'vitest';
import { AMPLIFIER_INPUTS, COMPENSATORS, inputLabel, PARTS, RANGE_INPUTS, RANGE_QUANTITIES, STAGE_INPUTS } from '@/lib/catalog';
import { rangeIssues, defaultRange } from '@/lib/engine/range';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { COMPENSATOR_TYPES } from '@/lib/engine/types';
import { compensatorIssues, stageIssues } from '@/lib/engine/validate';

const sample = SAMPLE_DESIGNS[0].request;

describe('engine validation messages read the catalogue', () => {
  it.each(STAGE_INPUTS.filter((s) => s.section !== 'modulator').map((s) => [inputLabel(s), s] as const))('%s', (label, spec) => {
    const bad = spec.bound === 'positive' ? 0 : -1;
    const req = structuredClone(sample);
    Reflect.set(req[spec.section], spec.field, bad);
    const issue = stageIssues(req).find((i) => i.path === `${spec.section}.${spec.field}`);
    expect(issue?.message).toBe(`${label} ${spec.bound === 'positive' ? 'must be above 0' : 'cannot be negative'}`);
  });

  it('names the mode inputs of peak current mode, and only those of the mode', () => {
    const issues = stageIssues({ ...sample, modulator: { mode: 'peak-current', ri: 0, se: -1 } });
    expect(issues.map((i) => i.message)).toEqual(['Current-sense gain Ri must be above 0', 'External ramp Se cannot be negative']);
  });

  it.each(COMPENSATOR_TYPES)('%s: every part the entry lists is required (C2 may be 0), named by its part name', (type) => {
    const entry = COMPENSATORS[type];
    const issues = compensatorIssues({ type, r1: 0, c1: 0 } as Parameters<typeof compensatorIssues>[0]);
    const required = entry.parts.filter((p) => p !== 'c2');
    expect(issues.map((i) => i.path)).toEqual(required.map((p) => `compensator.${p}`));
    for (const [k, i] of issues.entries()) expect(i.message.startsWith(PARTS[required[k]].name)).toBe(true);
  });

  it('names the amplifier inputs by their catalogue labels', () => {
    const issues = compensatorIssues({ type: 'type2', amplifier: 'transconductance', r1: 1e4, r2: 1e4, c1: 1e-9, gm: 0, rb: 1e3, ro: -1 });
    expect(issues.map((i) => i.message)).toEqual([
      `${AMPLIFIER_INPUTS.gm.label} gm (S) must be above 0`,
      `${AMPLIFIER_INPUTS.ro.label} ro (omit for infinite) must be above 0`,
    ]);
  });

  it('names the range quantities as the range form does', () => {
    const range = { ...defaultRange(sample.converter), l: { tol: 1.5 } };
    const [issue] = rangeIssues(range);
    expect(issue).toEqual({ path: 'range.l.tol', message: `${RANGE_QUANTITIES.l.label} tolerance must be from 0 to under 100 %` });
    expect(RANGE_INPUTS.find((s) => s.path === 'range.l.tol')?.label.startsWith(RANGE_QUANTITIES.l.label)).toBe(true);
    for (const s of RANGE_INPUTS) expect(s.label && s.unit && s.path).toBeTruthy();
  });
});
