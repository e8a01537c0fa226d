/**
 * POST /api/analyze/transient and /api/analyze/switching: contract, 400 naming the field,
 * 422 for impossible steps and for work above the cycle limit, never 500.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { Client, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');
let viewer: Client;
const buck = structuredClone(SAMPLE_DESIGNS[0].request);

beforeAll(async () => {
  viewer = await signedInAs(baseUrl, 'viewer'); // writes nothing: every role may run it
});

const num = expect.any(Number);

describe('POST /api/analyze/transient', () => {
  const post = (body: unknown) => viewer.json('/api/analyze/transient', 'POST', body);
  it('401 without a session', async () => {
    expect((await new Client(baseUrl).json('/api/analyze/transient', 'POST', { ...buck, step: { kind: 'load', from: 1, to: 2 } })).status).toBe(401);
  });
  it('answers a load step with its read-outs', async () => {
    const res = await post({ ...buck, step: { kind: 'load', from: 1.5, to: 3, slew: 1e6 } });
    expect(res.status).toBe(200);
    const r = await res.json();
    expect(r.t.length).toBe(r.vout.length);
    expect(r.t.length).toBeGreaterThan(500);
    expect(r).toMatchObject({ peakDeviation: num, overshoot: num, band: 0.01, outsideModel: [] });
    expect(r.peakDeviation).toBeLessThan(0);
    expect(r.settlingTime === null || typeof r.settlingTime === 'number').toBe(true);
    expect(r.closedLoop).toMatchObject({ zoutClosedPeakOhm: num, lineRejectionAtFswDb: num, lineRejectionAtMainsDb: num, mainsRippleHz: 100 });
  });
  it('a line step outside the model says why', async () => {
    const r = await (await post({ ...buck, step: { kind: 'line', from: 24, to: 5.5 } })).json();
    expect(r.outsideModel.length).toBeGreaterThan(0);
  });
  it('400 naming the field for a misfit step, and for a missing one', async () => {
    const bad = await post({ ...buck, step: { kind: 'jump', from: 1, to: 'x' } });
    expect(bad.status).toBe(400);
    const paths = (await bad.json()).issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['step.kind', 'step.to']));
    const missing = await post(buck);
    expect(missing.status).toBe(400);
    expect((await missing.json()).issues[0].path).toBe('step');
  });
  it('422 for a step that is no step', async () => {
    const res = await post({ ...buck, step: { kind: 'load', from: 2, to: 2 } });
    expect(res.status).toBe(422);
    expect((await res.json()).issues[0].path).toBe('step.to');
  });
});

describe('POST /api/analyze/switching', () => {
  const post = (body: unknown) => viewer.json('/api/analyze/switching', 'POST', body);
  it('injections: points with the model beside them, T sign as /api/analyze', async () => {
    const fsw = buck.converter.fsw;
    const res = await post({ ...buck, injection: { frequencies: [fsw / 40, fsw / 10] } });
    expect(res.status).toBe(200);
    const r = await res.json();
    expect(r.points).toHaveLength(2);
    for (const p of r.points) {
      expect(p).toMatchObject({ hz: num, magDb: num, phaseDeg: num, modelMagDb: num, modelPhaseDeg: num });
      expect(Math.abs(p.magDb - p.modelMagDb)).toBeLessThan(0.5);
    }
    expect(r.steadyState).toMatchObject({ voutAvg: num, voutRipplePp: num, inductorRipplePp: num, duty: num });
    expect(r.waveform.t.length).toBe(r.waveform.vout.length);
  });
  it('a step cycle by cycle next to the averaged one', async () => {
    const res = await post({ ...buck, step: { kind: 'load', from: 1.5, to: 3 } });
    expect(res.status).toBe(200);
    const r = await res.json();
    expect(r.cycles.voutAvg.length).toBe(r.cycles.t.length);
    expect(r.averaged.t.length).toBe(r.averaged.vout.length);
    expect(r.waveform.vout.length).toBeGreaterThan(100);
  });
  it('400 without exactly one of step or injection; above fsw/3 is 422', async () => {
    expect((await post(buck)).status).toBe(400);
    expect((await post({ ...buck, step: { kind: 'load', from: 1, to: 2 }, injection: { frequencies: [1e3] } })).status).toBe(400);
    const high = await post({ ...buck, injection: { frequencies: [buck.converter.fsw / 2] } });
    expect(high.status).toBe(422);
    expect((await high.json()).issues[0].path).toBe('injection.frequencies.0');
  });
  it('422 above the work limit, answered at once', async () => {
    const t0 = Date.now();
    const res = await post({ ...buck, injection: { frequencies: [10] } });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.issues[0].path).toBe('injection.frequencies');
    expect(body.issues[0].message).toMatch(/limit/);
    expect(Date.now() - t0).toBeLessThan(10_000);
  });
});
