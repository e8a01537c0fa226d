import { describe, expect, it } from 'vitest';
import {
  COMPENSATORS,
  inputByPath,
  inputPath,
  landmarksSetBy,
  MARGIN_LIMITS,
  marginTone,
  PART_ORDER,
  PARTS,
  presentLandmarks,
  SIGNOFF_STATE_LABELS,
  SIGNOFF_STATES,
  STAGE_INPUTS,
  TOPOLOGY_LABELS,
  TRACE_COLORS,
} from '@/lib/catalog';
import { AMPLIFIERS, COMPENSATOR_TYPES, TOPOLOGIES } from '@/lib/engine/types';
import { compensatorFor, partRole } from '@/lib/catalog/compensators';
import { plantTraceName } from '@/lib/catalog/modes';
import { analyzeRequestSchema, modulatorFieldsSchema } from '@/lib/validation/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { shapeFromParts } from '@/lib/engine/compensator';

describe('stage inputs', () => {
  it.each(STAGE_INPUTS.map((s) => [inputPath(s), s] as const))('%s has a label, symbol, unit, bound and help', (_path, spec) => {
    expect(spec.label.trim()).not.toBe('');
    expect(spec.symbol.trim()).not.toBe('');
    expect(spec.unit).toBeTruthy();
    expect(['positive', 'nonNegative']).toContain(spec.bound);
    expect(spec.help.trim()).not.toBe('');
  });

  it('paths are unique and every path is a field the request schema knows', () => {
    const paths = STAGE_INPUTS.map(inputPath);
    expect(new Set(paths).size).toBe(paths.length);
    for (const spec of STAGE_INPUTS) expect(Object.keys(sectionShape(spec.section))).toContain(spec.field);
  });

  it('every numeric field of converter, modulator and feedback has an entry', () => {
    for (const section of ['converter', 'modulator', 'feedback'] as const) {
      const numeric = Object.keys(sectionShape(section)).filter((k) => !['topology', 'mode'].includes(k));
      for (const field of numeric) expect(inputByPath(`${section}.${field}`), `${section}.${field}`).not.toBeNull();
    }
  });
});

/** The fields of a section's schema (the modulator's before its per-mode check). */
function sectionShape(section: 'converter' | 'modulator' | 'feedback') {
  if (section === 'modulator') return modulatorFieldsSchema.shape;
  return analyzeRequestSchema.shape[section].shape;
}

describe('compensator registry', () => {
  it('has an entry for every compensator type, with label, parts and a known amplifier', () => {
    for (const type of COMPENSATOR_TYPES) {
      const e = COMPENSATORS[type];
      expect(e.type).toBe(type);
      expect(e.label.trim()).not.toBe('');
      expect(e.summary.trim()).not.toBe('');
      expect(AMPLIFIERS).toContain(e.amplifier);
      expect(e.parts.length).toBeGreaterThan(0);
      for (const p of [...e.parts, ...e.zeros.flatMap((z) => z.parts), ...e.poles.flatMap((z) => z.parts), ...e.gain.parts]) expect(PART_ORDER).toContain(p);
    }
  });

  it('every part has a name, a unit and a role', () => {
    for (const key of PART_ORDER) {
      expect(PARTS[key].name).toMatch(/^[RC]/);
      expect(['Ω', 'F']).toContain(PARTS[key].unit);
      expect(PARTS[key].role.trim()).not.toBe('');
    }
  });

  it('lists as many zeros and poles as the engine shape of each sample holds', () => {
    for (const s of SAMPLE_DESIGNS) {
      const shape = shapeFromParts(s.request.compensator);
      const e = COMPENSATORS[shape.type];
      expect(e.zeros.length).toBe(shape.zerosHz.length);
      expect(presentLandmarks(e.poles, shape.polesHz.length).length).toBe(shape.polesHz.length);
    }
  });

  it('drops the optional C2 pole first when a shape has fewer poles', () => {
    expect(presentLandmarks(COMPENSATORS.type3.poles, 1).map((l) => l.formula)).toEqual(['R3·C3']);
    expect(presentLandmarks(COMPENSATORS.type2.poles, 0)).toEqual([]);
  });

  it('around a transconductance amplifier names the gm formulas (module header of lib/engine/compensator.ts)', () => {
    const gm = compensatorFor('type3', 'transconductance');
    expect(gm.gain.formula).toContain('gm');
    expect(gm.integrator).toBe('gm·Rb/(2π·(R1+Rb)·(C1+C2))');
    expect(gm.poles.map((p) => p.formula)).toEqual(['C2', '(R3+R1∥Rb)·C3']);
    expect(partRole('type2', 'c1', 'transconductance')).toMatch(/COMP to ground/);
    expect(landmarksSetBy('type3', 'rb', 'transconductance')).toEqual(['pole 2', 'gain']);
    // The op-amp reading is unchanged.
    expect(compensatorFor('type2', 'opamp').integrator).toBe('1/(2π·R1·(C1+C2))');
    expect(compensatorFor('type2', undefined)).toBe(COMPENSATORS.type2);
    for (const type of ['type2', 'type3'] as const) {
      const e = compensatorFor(type, 'transconductance');
      expect(e.zeros.length).toBe(COMPENSATORS[type].zeros.length);
      expect(e.poles.length).toBe(COMPENSATORS[type].poles.length);
      expect(e.integrator).not.toContain('R1·(C1');
    }
  });

  it('names the power-stage trace after the plant the loop uses', () => {
    expect(plantTraceName('voltage', 'CCM')).toBe('Power stage Gvd/Vramp');
    expect(plantTraceName('peak-current', 'CCM')).toMatch(/Gvc/);
    expect(plantTraceName('peak-current', 'DCM')).toMatch(/Gvc.*DCM/);
    expect(plantTraceName('voltage', 'DCM')).toMatch(/DCM/);
  });

  it('says which landmarks a part sets', () => {
    expect(landmarksSetBy('type3', 'r3')).toEqual(['zero 2', 'pole 2']);
    expect(landmarksSetBy('type2', 'c2')).toEqual(['pole', 'gain']);
  });
});

describe('labels and limits', () => {
  it('names every sign-off state and topology, colours every trace', () => {
    for (const s of SIGNOFF_STATES) expect(SIGNOFF_STATE_LABELS[s]).toBeTruthy();
    for (const t of TOPOLOGIES) expect(TOPOLOGY_LABELS[t]).toBeTruthy();
    for (const c of Object.values(TRACE_COLORS)) expect(c).toMatch(/^#[0-9a-f]{6}$/);
  });

  it('margin tones follow the shared limits (common practice 45°/30°, 10 dB/6 dB)', () => {
    expect(MARGIN_LIMITS.phaseMarginDeg).toMatchObject({ caution: 45, risk: 30 });
    expect(marginTone('phaseMarginDeg', 50)).toBe('good');
    expect(marginTone('phaseMarginDeg', 40)).toBe('caution');
    expect(marginTone('phaseMarginDeg', 20)).toBe('risk');
    expect(marginTone('gainMarginDb', 8)).toBe('caution');
    expect(marginTone('gainMarginDb', null)).toBe('none');
  });
});
