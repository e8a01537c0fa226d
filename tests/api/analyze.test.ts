/**
 * Issue 3 item 9: POST /api/analyze honours its contract field by field,
 * answers 400 / 422 naming the field, and never 500.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { Client, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');
let viewer: Client;
const boost = structuredClone(SAMPLE_DESIGNS.find((s) => s.request.converter.topology === 'boost')!.request);
const buck = structuredClone(SAMPLE_DESIGNS.find((s) => s.request.converter.topology === 'buck')!.request);

beforeAll(async () => {
  viewer = await signedInAs(baseUrl, 'viewer'); // analysis writes nothing: every role may run it
});

const post = (body: unknown) => viewer.json('/api/analyze', 'POST', body);
const num = expect.any(Number);
const numOrNull = (v: unknown) => v === null || typeof v === 'number';

describe('POST /api/analyze', () => {
  it('401 without a session', async () => {
    expect((await new Client(baseUrl).json('/api/analyze', 'POST', boost)).status).toBe(401);
  });

  it('answers the contract for a boost', async () => {
    const res = await post({ ...boost, parts: { resistorSeries: 'E24', capacitorSeries: 'E6' } });
    expect(res.status).toBe(200);
    const r = await res.json();
    expect(r.operatingPoint).toMatchObject({ duty: num });
    expect(r.plant).toMatchObject({ dcGainDb: num, resonanceHz: num, q: num, rhpZeroHz: num });
    expect(numOrNull(r.plant.esrZeroHz)).toBe(true);
    expect(r.compensator.polesHz).toContain(0); // the origin pole is listed as 0
    expect(r.compensator).toMatchObject({ zerosHz: expect.any(Array), midbandGainDb: num });
    expect(r.margins).toMatchObject({ crossoverHz: num, phaseMarginDeg: num });
    expect(numOrNull(r.margins.gainMarginDb)).toBe(true);
    for (const c of r.margins.crossings) {
      expect(['gain', 'phase']).toContain(c.kind);
      expect(['down', 'up']).toContain(c.direction);
      expect(c.hz).toEqual(num);
    }
    for (const key of ['ideal', 'snapped'] as const)
      expect(Object.keys(r.parts[key]).sort()).toEqual(['c1', 'c2', 'c3', 'r1', 'r2', 'r3', 'rb']);
    expect(r.parts).toMatchObject({ resistorSeries: 'E24', capacitorSeries: 'E6', snappedMargins: { crossoverHz: num } });
    // Default sweep: 10 Hz to fsw/2, 400 points, logarithmic.
    expect(r.bode.f).toHaveLength(400);
    expect(r.bode.f[0]).toBeCloseTo(10, 6);
    expect(r.bode.f[399]).toBeCloseTo(boost.converter.fsw / 2, 0);
    for (const t of ['loop', 'plant', 'compensator'] as const) {
      expect(r.bode[t].magDb).toHaveLength(400);
      expect(r.bode[t].phaseDeg).toHaveLength(400);
    }
    // loop = compensator + plant in dB, each rounded to 6 significant digits
    expect(r.bode.loop.magDb[123]).toBeCloseTo(r.bode.plant.magDb[123] + r.bode.compensator.magDb[123], 3);
    for (const v of [...r.bode.f, ...r.bode.loop.magDb, ...r.bode.loop.phaseDeg])
      expect(Number(Math.abs(v).toPrecision(6))).toBe(Math.abs(v));
    expect(Array.isArray(r.checks)).toBe(true);
  });

  it('buck: no RHP zero; a request may set its own sweep', async () => {
    const r = await (await post({ ...buck, sweep: { fStart: 100, fStop: 100e3, points: 50 } })).json();
    expect(r.plant.rhpZeroHz).toBeNull();
    expect(r.bode.f).toHaveLength(50);
    expect(r.bode.f[0]).toBeCloseTo(100, 6);
  });

  it('leaves the arrays out on ?arrays=0 or output.arrays false, with the same margins', async () => {
    const full = await (await post(boost)).json();
    for (const res of [
      await viewer.json('/api/analyze?arrays=0', 'POST', boost),
      await post({ ...boost, output: { arrays: false } }),
    ]) {
      expect(res.status).toBe(200);
      const r = await res.json();
      expect(r.bode).toBeUndefined();
      expect(r.margins).toEqual(full.margins);
      expect(r.checks).toEqual(full.checks);
    }
    expect((await viewer.json('/api/analyze?arrays=1', 'POST', { ...boost, output: { arrays: false } })).status).toBe(200);
    const bad = await post({ ...boost, output: { arrays: 'no' } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues.map((i: { path: string }) => i.path)).toContain('output.arrays');
    expect((await viewer.json('/api/analyze?arrays=maybe', 'POST', boost)).status).toBe(400);
  });

  it('answers gzip-compressed when asked', async () => {
    const res = await viewer.fetch('/api/analyze', {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'accept-encoding': 'gzip' },
      body: JSON.stringify(boost),
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-encoding')).toBe('gzip');
  });

  it('400 naming the field for a body that does not fit', async () => {
    const res = await post({ ...boost, converter: { ...boost.converter, topology: 'flyback', vin: 'twelve' } });
    expect(res.status).toBe(400);
    const paths = (await res.json()).issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['converter.topology', 'converter.vin']));
  });

  it('400 for a body that is not JSON', async () => {
    const res = await post('{"converter":');
    expect(res.status).toBe(400);
  });

  it.each([
    ['buck with vout ≥ vin', { ...buck, converter: { ...buck.converter, vout: 30 } }, 'converter.vout'],
    ['zero inductance', { ...boost, converter: { ...boost.converter, l: 0 } }, 'converter.l'],
    ['negative inductance', { ...buck, converter: { ...buck.converter, l: -1e-6 } }, 'converter.l'],
    ['boost with vout ≤ vin', { ...boost, converter: { ...boost.converter, vout: 3 } }, 'converter.vout'],
  ])('422 for %s, naming %s', async (_label, body, path) => {
    const res = await post(body);
    expect(res.status).toBe(422);
    const err = await res.json();
    expect(err.error).toEqual(expect.any(String));
    expect(err.issues.map((i: { path: string }) => i.path)).toContain(path);
  });

  it('never answers 500 to odd bodies', async () => {
    const odd: unknown[] = [
      null,
      [],
      42,
      {},
      { ...boost, compensator: { type: 'type3', r1: 10e3, c1: 1e-9 } },
      { ...boost, converter: { ...boost.converter, iout: 1e-9 } },
      { ...boost, converter: { ...boost.converter, fsw: 1e12 } },
      { ...boost, sweep: { fStart: 1e6, fStop: 10, points: 50 } },
      { ...boost, compensator: { ...boost.compensator, r2: 0 } },
    ];
    for (const body of odd) {
      const res = await post(body);
      expect([200, 400, 422], JSON.stringify(body)).toContain(res.status);
    }
  });
});
