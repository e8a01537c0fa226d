/**
 * Control modes and amplifiers over HTTP: a current-mode buck, a current-mode boost with a
 * transconductance amplifier and a voltage-mode boost at light load (DCM) are each analysed,
 * saved, retuned as a handle drag would (shape → parts), saved again, compared and exported.
 * The request shapes answer 400/422 naming the field and never 500.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { partsFromShape, shapeFromParts } from '@/lib/engine/compensator';
import { sampleByKey } from '@/lib/engine/samples';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { Client, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');
let designer: Client;

beforeAll(async () => {
  designer = await signedInAs(baseUrl, 'designer');
});

const sample = (key: string, label: string): [string, AnalyzeRequest] => [label, sampleByKey(key).request];
const DESIGNS: [string, AnalyzeRequest][] = [
  sample('cm-buck-opamp-type2', 'current-mode buck'),
  sample('cm-boost-gm-type2', 'current-mode boost with a transconductance amplifier'),
  sample('vm-boost-dcm-type2', 'voltage-mode boost at light load'),
];

describe('control modes over HTTP', () => {
  it.each(DESIGNS)('%s: analyse, save, retune, save, compare, export', async (name, input) => {
    const analysed = await designer.json('/api/analyze', 'POST', input);
    expect(analysed.status).toBe(200);
    const r = await analysed.json();
    expect(r.margins.crossoverHz).toEqual(expect.any(Number));
    expect(r.modulator.mode).toBe(input.modulator.mode ?? 'voltage');
    expect(r.compensator.amplifier).toBe(input.compensator.amplifier ?? 'opamp');
    if (name.includes('light load')) {
      expect(r.operatingPoint.conduction).toBe('DCM');
      expect(r.dcmPoleHz).toEqual(expect.any(Number));
      expect(r.checks.map((c: { id: string }) => c.id)).toContain('dcm-model');
    } else {
      expect(r.modulator.samplingPoleHz).toBe(input.converter.fsw / 2);
      expect(r.modulator.qp).toEqual(expect.any(Number));
    }

    const created = await designer.json('/api/designs', 'POST', { name: `Modes: ${name}`, topology: input.converter.topology });
    expect(created.status).toBe(201);
    const { id } = await created.json();
    const r1 = await designer.json(`/api/designs/${id}/revisions`, 'POST', { baseRevision: null, note: 'first', input });
    expect(r1.status).toBe(201);
    // A drag of the zero handle: the shape moves, the parts follow (amplifier fields kept).
    const shape = shapeFromParts(input.compensator);
    const moved = partsFromShape({ ...shape, zerosHz: shape.zerosHz.map((z) => z * 0.8) });
    expect(moved.amplifier).toBe(input.compensator.amplifier);
    const r2 = await designer.json(`/api/designs/${id}/revisions`, 'POST', { baseRevision: 1, note: 'zero moved down', input: { ...input, compensator: moved } });
    expect(r2.status).toBe(201);
    const back = await (await designer.fetch(`/api/designs/${id}/revisions/2`)).json();
    expect(back.input.modulator).toEqual(input.modulator.mode ? input.modulator : { vramp: (input.modulator as { vramp: number }).vramp });
    expect(back.input.compensator.amplifier).toBe(input.compensator.amplifier);

    const compare = await designer.fetch(`/designs/${id}/compare?a=1&b=2`);
    expect(compare.status).toBe(200);
    const html = await compare.text();
    expect(html).toContain(input.modulator.mode === 'peak-current' ? 'Peak current mode' : 'Voltage mode');

    const exp = (format: string) => designer.fetch(`/api/designs/${id}/revisions/2/export?format=${format}`);
    const json = await (await exp('json')).json();
    expect(json.input.modulator).toEqual(back.input.modulator);
    expect(json.input.compensator).toEqual(back.input.compensator);
    const report = await (await exp('report')).text();
    expect(report).toContain(input.modulator.mode === 'peak-current' ? 'Current-sense gain Ri' : 'PWM ramp Vramp');
    if (input.compensator.amplifier === 'transconductance') expect(report).toContain('Transconductance gm');
    if (name.includes('light load')) expect(report).toContain('DCM low-frequency pole');
    const csv = await (await exp('csv')).text();
    expect(csv).toContain('R2');
    if (input.compensator.amplifier === 'transconductance') expect(csv).toMatch(/part of the loop gain/);
    const cir = await (await exp('spice')).text();
    expect(cir).toMatch(input.compensator.amplifier === 'transconductance' ? /^Gamp /m : /^Eamp /m);
    if (input.modulator.mode === 'peak-current') expect(cir).toMatch(/^Bhe heil /m);
    if (name.includes('light load')) expect(cir).toMatch(/^Bi2 /m);
  });
});

describe('POST /api/analyze: new request shapes', () => {
  const [, cmBuck] = DESIGNS[0];
  const [, gmBoost] = DESIGNS[1];
  const post = (body: unknown) => designer.json('/api/analyze', 'POST', body);
  const pathsOf = async (res: Response) => ((await res.json()).issues as { path: string }[]).map((i) => i.path);

  it.each([
    ['peak current without ri', { ...cmBuck, modulator: { mode: 'peak-current', se: 0 } }, 'modulator.ri'],
    ['an unknown mode', { ...cmBuck, modulator: { mode: 'hysteretic', vramp: 1 } }, 'modulator.mode'],
    ['voltage mode without vramp', { ...cmBuck, modulator: { mode: 'voltage' } }, 'modulator.vramp'],
    ['an unknown amplifier', { ...cmBuck, compensator: { ...cmBuck.compensator, amplifier: 'ota' } }, 'compensator.amplifier'],
    ['gm as text', { ...gmBoost, compensator: { ...gmBoost.compensator, gm: '1m' } }, 'compensator.gm'],
    ['an op-amp without gbw', { ...cmBuck, compensator: { ...cmBuck.compensator, opamp: { a0: 1e5 } } }, 'compensator.opamp.gbw'],
  ])('400 for %s, naming %s', async (_l, body, path) => {
    const res = await post(body);
    expect(res.status).toBe(400);
    expect(await pathsOf(res)).toContain(path);
  });

  it.each([
    ['ri = 0', { ...cmBuck, modulator: { mode: 'peak-current', ri: 0, se: 0 } }, 'modulator.ri'],
    ['a negative ramp', { ...cmBuck, modulator: { mode: 'peak-current', ri: 0.5, se: -1 } }, 'modulator.se'],
    ['a gm amplifier on Type I', { ...gmBoost, compensator: { type: 'type1', amplifier: 'transconductance', gm: 1e-3, rb: 1e4, r1: 1e4, c1: 1e-9 } }, 'compensator.amplifier'],
    ['a gm amplifier without Rb', { ...gmBoost, compensator: { ...gmBoost.compensator, rb: undefined } }, 'compensator.rb'],
    ['gm = 0', { ...gmBoost, compensator: { ...gmBoost.compensator, gm: 0 } }, 'compensator.gm'],
    ['an op-amp with GBW 0', { ...cmBuck, compensator: { ...cmBuck.compensator, opamp: { a0: 1e5, gbw: 0 } } }, 'compensator.opamp.gbw'],
  ])('422 for %s, naming %s', async (_l, body, path) => {
    const res = await post(body);
    expect(res.status).toBe(422);
    expect(await pathsOf(res)).toContain(path);
  });

  it('never answers 500 to odd mode and amplifier bodies', async () => {
    const odd: unknown[] = [
      { ...cmBuck, modulator: { mode: 'peak-current', ri: 1e-12, se: 1e30 } },
      { ...cmBuck, modulator: { mode: 'peak-current', ri: 1e12, se: 0 } },
      { ...cmBuck, modulator: null },
      { ...cmBuck, modulator: { mode: 'peak-current', ri: 0.5, se: 0 }, converter: { ...cmBuck.converter, vout: 11.9 } },
      { ...gmBoost, compensator: { ...gmBoost.compensator, ro: 1e-9 } },
      { ...gmBoost, compensator: { ...gmBoost.compensator, type: 'type3' } },
      { ...cmBuck, compensator: { ...cmBuck.compensator, opamp: { a0: 1e-9, gbw: 1e-9 } } },
      { ...cmBuck, compensator: { type: 'type3', r1: 10e3, r2: 10e3, r3: 100, c1: 1e-9, c2: 0, c3: 1e-9, opamp: { a0: 1e12, gbw: 1e15 } } },
      { ...cmBuck, converter: { ...cmBuck.converter, iout: 1e-9 } },
      { ...gmBoost, converter: { ...gmBoost.converter, iout: 1e-6 }, modulator: { vramp: 1 } },
    ];
    for (const body of odd) {
      const res = await post(body);
      expect([200, 400, 422], JSON.stringify(body)).toContain(res.status);
    }
  });
});
