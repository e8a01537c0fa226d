import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { partChecks, stageChecks } from '@/lib/engine/checks';
import { partsFromShape, shapeFromParts } from '@/lib/engine/compensator';
import { computeOperatingPoint } from '@/lib/engine/steady-state';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { makeRequest } from './helpers';

const ids = (r: ReturnType<typeof analyze>) => Object.fromEntries(r.checks.map((c) => [c.id, c.level]));

describe('checks (thresholds: common practice, CHECK-VALUES §4)', () => {
  const buck = SAMPLE_DESIGNS[0].request;
  const boost = SAMPLE_DESIGNS[1].request;

  it('crossover above fsw/5 is a caution, above fsw/2 a risk', () => {
    // Raise the sample buck's gain (same poles and zeros): fc moves up with it.
    const shape = shapeFromParts(buck.compensator);
    const gained = (k: number) => ({ ...buck, compensator: partsFromShape({ ...shape, integratorHz: shape.integratorHz * k }) });
    const hot = analyze(gained(2.5));
    expect(hot.margins.crossoverHz!).toBeGreaterThan(80e3);
    expect(hot.margins.crossoverHz!).toBeLessThan(200e3);
    expect(ids(hot)['crossover-vs-switching']).toBe('caution');
    // fc above fsw/2 can only be seen with a sweep that extends past it.
    const hotter = analyze({ ...gained(20), sweep: { fStart: 10, fStop: 2e6, points: 400 } });
    expect(hotter.margins.crossoverHz!).toBeGreaterThan(200e3);
    expect(ids(hotter)['crossover-vs-switching']).toBe('risk');
  });

  it('crossover near or above the RHP zero', () => {
    const c = boost.compensator;
    const r = analyze({ ...boost, compensator: { ...c, r1: c.r1 / 4 } });
    expect(r.margins.crossoverHz!).toBeGreaterThan(r.plant.rhpZeroHz! / 3);
    expect(['caution', 'risk']).toContain(ids(r)['crossover-vs-rhp-zero']);
  });

  it('low phase margin and low gain margin', () => {
    const c = boost.compensator;
    const r = analyze({ ...boost, compensator: { ...c, r1: c.r1 / 4 } });
    expect(r.margins.phaseMarginDeg!).toBeLessThan(45);
    expect(ids(r)['phase-margin-low']).toBe(r.margins.phaseMarginDeg! < 30 ? 'risk' : 'caution');
    expect(ids(r)['gain-margin-low']).toBe(r.margins.gainMarginDb! < 6 ? 'risk' : 'caution');
  });

  it('duty outside 5–95 % is a caution', () => {
    const op = computeOperatingPoint(makeRequest({ converter: { vin: 48, vout: 1.2, iout: 1 } }).converter);
    expect(stageChecks(op).map((c) => [c.id, c.level])).toContainEqual(['duty-extreme', 'caution']);
  });

  it('below the CCM/DCM boundary the DCM model is used: a note, no risk', () => {
    const req = makeRequest({ converter: { iout: 0.05 } });
    expect(computeOperatingPoint(req.converter).conduction).toBe('DCM');
    const r = analyze(req);
    expect(r.operatingPoint.conduction).toBe('DCM');
    const c = r.checks.find((x) => x.id === 'dcm-model')!;
    expect(c.level).toBe('note');
    expect(c.message).toMatch(/DCM/);
    expect(r.checks.some((x) => x.id === 'dcm-at-load')).toBe(false);
  });

  it('parts outside 1 kΩ…1 MΩ or below 10 pF get one note naming them', () => {
    const notes = partChecks({ type: 'type3', r1: 10e3, r2: 2.2e6, r3: 330, c1: 1e-9, c2: 4.7e-12, c3: 1e-9 }, 5e3);
    expect(notes).toHaveLength(1);
    expect(notes[0].level).toBe('note');
    expect(notes[0].message).toMatch(/R2/);
    expect(notes[0].message).toMatch(/R3/);
    expect(notes[0].message).toMatch(/C2/);
    expect(partChecks({ type: 'type2', r1: 10e3, r2: 22e3, c1: 1e-9, c2: 47e-12 }, 5e3)).toEqual([]);
  });

  it('every check has a stable kebab-case id and a message', () => {
    const r = analyze({ ...boost, compensator: { ...boost.compensator, r1: 1e3 / 4 } });
    for (const c of r.checks) {
      expect(c.id).toMatch(/^[a-z]+(-[a-z0-9]+)*$/);
      expect(c.message.length).toBeGreaterThan(40);
    }
  });
});
