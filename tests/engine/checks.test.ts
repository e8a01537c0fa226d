import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { loopChecks, partChecks, stageChecks } from '@/lib/engine/checks';
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

describe('margin checks compare the value as shown (0.1° / 0.1 dB)', () => {
  const loop = { f: [1e3, 1e4, 1e5], magDb: [20, 0, -20], phaseDeg: [-100, -130, -170] };
  const checksFor = (pm: number, gm: number) =>
    loopChecks({
      margins: { crossoverHz: 1e4, phaseMarginDeg: pm, gainMarginDb: gm, phaseCrossoverHz: 2e5, crossings: [{ kind: 'gain', hz: 1e4, direction: 'down' }] },
      loop,
      fsw: 1e6,
      rhpZeroHz: null,
    });

  it('44.96° reads 45.0° and raises nothing; 44.94° reads 44.9° (under 45°)', () => {
    expect(checksFor(44.96, 20).find((c) => c.id === 'phase-margin-low')).toBeUndefined();
    const low = checksFor(44.94, 20).find((c) => c.id === 'phase-margin-low');
    expect(low?.message).toContain('Phase margin is 44.9° (under 45°)');
    for (const pm of [29.96, 44.951, 45, 45.04]) {
      for (const c of checksFor(pm, 20)) expect(c.message).not.toMatch(/is 45\.0° \(under 45°\)|is 30\.0° \(under 30°\)/);
    }
  });

  it('9.96 dB reads 10.0 dB and raises nothing; 5.96 dB is a caution, not a risk', () => {
    expect(checksFor(60, 9.96).find((c) => c.id === 'gain-margin-low')).toBeUndefined();
    expect(checksFor(60, 5.96).find((c) => c.id === 'gain-margin-low')?.level).toBe('caution');
    expect(checksFor(60, 5.94).find((c) => c.id === 'gain-margin-low')?.message).toContain('5.9 dB (under 6 dB)');
  });
});
