/** POST /api/analyze/corners and /api/analyze/spread: contract, 400/422 naming the field, bounded work. */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { Client, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');
let viewer: Client;
const boost = structuredClone(SAMPLE_DESIGNS.find((s) => s.request.converter.topology === 'boost')!.request);
const range = { vin: { min: 3.0, max: 4.2 }, iout: { min: 0.05, max: 0.5 }, l: { tol: 0.2 }, c: { tol: 0.2 }, rc: { min: 0.04, max: 0.24 } };

beforeAll(async () => {
  viewer = await signedInAs(baseUrl, 'viewer'); // both analyses write nothing: every role may run them
});

describe('POST /api/analyze/corners', () => {
  it('401 without a session', async () => {
    expect((await new Client(baseUrl).json('/api/analyze/corners', 'POST', { ...boost, range })).status).toBe(401);
  });

  it('answers every corner with the values it used and the worst case', async () => {
    const res = await viewer.json('/api/analyze/corners', 'POST', { ...boost, range });
    expect(res.status).toBe(200);
    const r = await res.json();
    expect(r.corners).toHaveLength(32);
    const k = r.corners[r.worst.phaseMarginDeg.corner];
    expect(k).toMatchObject({ vin: expect.any(Number), iout: expect.any(Number), l: expect.any(Number), c: expect.any(Number), rc: expect.any(Number), duty: expect.any(Number) });
    expect(['CCM', 'DCM']).toContain(k.conduction);
    // Anyone can recompute a corner from the values it carries.
    const again = analyze({ ...boost, converter: { ...boost.converter, vin: k.vin, iout: k.iout, l: k.l, c: k.c, rc: k.rc } });
    expect(k.margins.phaseMarginDeg).toBe(again.margins.phaseMarginDeg);
    expect(r.worst.phaseMarginDeg.value).toBe(k.margins.phaseMarginDeg);
    expect(r.worst.crossoverHz.min).toBeLessThanOrEqual(r.worst.crossoverHz.max);
    expect(r.checks.map((c: { id: string }) => c.id)).toContain('worst-phase-margin');
    expect(k.loop).toBeUndefined();
  });

  it('without a range uses the design defaults and says which', async () => {
    const r = await (await viewer.json('/api/analyze/corners', 'POST', boost)).json();
    expect(r.range.l).toEqual({ tol: 0.2 });
    expect(r.corners.length).toBeGreaterThan(1);
  });

  it('400 names a misfit range field; 422 names an impossible one', async () => {
    const bad = await viewer.json('/api/analyze/corners', 'POST', { ...boost, range: { ...range, vin: { min: 'low', max: 4 } } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues[0].path).toBe('range.vin.min');
    const impossible = await viewer.json('/api/analyze/corners', 'POST', { ...boost, range: { ...range, vin: { min: 3, max: 13 } } });
    expect(impossible.status).toBe(422);
    expect((await impossible.json()).issues[0].path).toBe('range.vin.max');
  });
});

describe('POST /api/analyze/spread', () => {
  it('answers percentiles, histograms and the share meeting the targets; the seed reproduces', async () => {
    const body = { ...boost, range, samples: 2000, seed: 9, distribution: 'normal', targets: { phaseMarginDeg: 40, gainMarginDb: 8 } };
    const res = await viewer.json('/api/analyze/spread', 'POST', body);
    expect(res.status).toBe(200);
    const r = await res.json();
    expect(r).toMatchObject({ samples: 2000, seed: 9, distribution: 'normal', targets: { phaseMarginDeg: 40, gainMarginDb: 8 } });
    for (const q of ['crossoverHz', 'phaseMarginDeg', 'gainMarginDb']) {
      expect(r.percentiles[q].p1).toBeLessThanOrEqual(r.percentiles[q].p50);
      expect(r.percentiles[q].p50).toBeLessThanOrEqual(r.percentiles[q].p99);
      expect(r.histograms[q].edges).toHaveLength(r.histograms[q].counts.length + 1);
    }
    expect(r.meetsTargets.share).toBeGreaterThan(0);
    expect(r.meetsTargets.share).toBeLessThanOrEqual(1);
    const again = await (await viewer.json('/api/analyze/spread', 'POST', body)).json();
    expect(again.percentiles).toEqual(r.percentiles);
  });

  it('draws and returns a seed when none is given', async () => {
    const r = await (await viewer.json('/api/analyze/spread', 'POST', { ...boost, samples: 10 })).json();
    expect(Number.isInteger(r.seed)).toBe(true);
  });

  it('400 without samples; 422 above the sample limit, naming the field', async () => {
    const none = await viewer.json('/api/analyze/spread', 'POST', { ...boost, range });
    expect(none.status).toBe(400);
    expect((await none.json()).issues.map((i: { path: string }) => i.path)).toContain('samples');
    const many = await viewer.json('/api/analyze/spread', 'POST', { ...boost, range, samples: 100_001, seed: 1 });
    expect(many.status).toBe(422);
    expect((await many.json()).issues[0].path).toBe('samples');
  });
});
