/**
 * POST /api/analyze/switching runs its simulation in a worker thread (lib/switching-pool.ts),
 * on a server of this test's own with no room to wait (PHASEWRIGHT_SWITCHING_QUEUE=0):
 * another request is answered while a run computes, a run beyond the queue is told 503 with
 * Retry-After, and the answer names the worker path. Timing targets belong in the bench; the
 * bounds here are generous.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { startApp, type RunningApp } from '../support/app-server';
import { signedInAs, type Client } from '../support/http';

let app: RunningApp;
let viewer: Client;
const buck = structuredClone(SAMPLE_DESIGNS[0].request);
const fsw = buck.converter.fsw;

beforeAll(async () => {
  app = await startApp({ PHASEWRIGHT_SWITCHING_QUEUE: '0' });
  viewer = await signedInAs(app.baseUrl, 'viewer');
}, 120_000);
afterAll(() => app?.stop());

describe('switching simulation in a worker thread', () => {
  it('a GET during a run answers before the run ends; a second run is 503 with Retry-After', async () => {
    // About 8,200 switching cycles (the limit is 10,000): over a second of work, so the GET and
    // the second run arrive while it computes, even on a fast machine.
    const heavy = { ...buck, injection: { frequencies: [1000, 500, 250, 120, 60, 30, 15, 10].map((n) => fsw / n) } };
    let runEnded = 0;
    const run = viewer.json('/api/analyze/switching', 'POST', heavy).then((res) => {
      runEnded = performance.now();
      return res;
    });
    await new Promise((r) => setTimeout(r, 150)); // the run is parsed and computing by now
    const t0 = performance.now();
    const get = await viewer.fetch('/api/auth/csrf');
    const getMs = performance.now() - t0;
    const getEnded = performance.now();
    expect(get.status).toBe(200);
    const second = await viewer.json('/api/analyze/switching', 'POST', { ...buck, step: { kind: 'load', from: 1.5, to: 3 } });
    const first = await run;
    console.log(`[switching-worker] GET during a run: ${getMs.toFixed(0)} ms`);
    expect(getEnded).toBeLessThan(runEnded);
    expect(getMs).toBeLessThan(5_000);
    // Queue 0: whichever run came second is turned away.
    expect([first.status, second.status].sort()).toEqual([200, 503]);
    const busy = first.status === 503 ? first : second;
    expect(Number(busy.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await busy.json()).error).toMatch(/busy/);
    const done = first.status === 200 ? first : second;
    expect(done.headers.get('x-phasewright-compute')).toBe('worker');
  }, 60_000);

  it('the engine’s 422 comes back from the worker naming the field', async () => {
    const res = await viewer.json('/api/analyze/switching', 'POST', { ...buck, injection: { frequencies: [10] } });
    expect(res.status).toBe(422);
    expect((await res.json()).issues[0].path).toBe('injection.frequencies');
  });

  it('answers runs one after another (the worker is reused)', async () => {
    for (let k = 0; k < 2; k++) {
      const res = await viewer.json('/api/analyze/switching', 'POST', { ...buck, step: { kind: 'load', from: 1.5, to: 3 } });
      expect(res.status).toBe(200);
      expect(res.headers.get('x-phasewright-compute')).toBe('worker');
    }
  }, 60_000);
});
