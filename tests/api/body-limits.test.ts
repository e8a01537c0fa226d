/**
 * Bodies are limited before parsing: 4 parallel 400 MB bodies to /api/analyze
 * (declared with Content-Length, and streamed chunked without one) are each
 * refused with 413 after at most the route's limit was read; the server's
 * memory stays bounded (resident set sampled from /proc, printed). It used to
 * read them whole: 0.8 → 4.1 GB. The import's 1 MB limit holds before reading too.
 */
import fs from 'node:fs';
import http from 'node:http';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signedInAs, type Client } from '../support/http';

const baseUrl = inject('baseUrl');
const pid = inject('appPid');
let client: Client;
let cookie = '';

beforeAll(async () => {
  client = await signedInAs(baseUrl, 'designer');
  cookie = client.cookieHeader();
});

function rssMb(): number {
  const m = fs.readFileSync(`/proc/${pid}/status`, 'utf8').match(/VmRSS:\s+(\d+) kB/);
  return m ? Number(m[1]) / 1024 : NaN;
}

const BODY_BYTES = 400 * 1024 * 1024;
const CHUNK = Buffer.alloc(1024 * 1024, 0x20);

/**
 * Send up to `BODY_BYTES` to `path`, chunk by chunk as the socket drains, until the
 * server answers; resolves with the status and how much was written before the answer.
 */
function bigPost(path: string, declared: boolean): Promise<{ status: number; sentMb: number; ms: number }> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const url = new URL(path, baseUrl);
    const headers: Record<string, string> = { cookie, 'content-type': 'application/json' };
    if (declared) headers['content-length'] = String(BODY_BYTES);
    const req = http.request(url, { method: 'POST', headers });
    let sent = 0;
    let answered = false;
    req.on('response', (res) => {
      answered = true;
      res.resume();
      res.on('end', () => {
        resolve({ status: res.statusCode ?? 0, sentMb: sent / 1024 / 1024, ms: performance.now() - started });
        req.destroy();
      });
    });
    req.on('error', (err) => (answered ? undefined : reject(err)));
    const pump = () => {
      while (!answered && sent < BODY_BYTES) {
        sent += CHUNK.length;
        if (!req.write(CHUNK)) return void req.once('drain', pump);
      }
      if (!answered) req.end();
    };
    pump();
  });
}

describe('body limits', () => {
  it('4 parallel 400 MB bodies to /api/analyze → 413 each, memory bounded (figures printed)', async () => {
    const before = rssMb();
    let peak = before;
    const sampler = setInterval(() => (peak = Math.max(peak, rssMb())), 20);
    const results = await Promise.all([bigPost('/api/analyze', true), bigPost('/api/analyze', true), bigPost('/api/analyze', false), bigPost('/api/analyze', false)]);
    clearInterval(sampler);
    peak = Math.max(peak, rssMb());
    console.log(
      `[body-limits] 4 × 400 MB to /api/analyze: statuses ${results.map((r) => r.status).join(', ')}; client wrote ${results.map((r) => r.sentMb.toFixed(0)).join(', ')} MB before the answer in ${results.map((r) => r.ms.toFixed(0)).join(', ')} ms; server RSS ${before.toFixed(0)} → peak ${peak.toFixed(0)} MB (+${(peak - before).toFixed(0)} MB)`,
    );
    expect(results.every((r) => r.status === 413)).toBe(true);
    expect(peak - before).toBeLessThan(150);
    // the server still answers others
    expect((await client.fetch('/api/designs')).status).toBe(200);
  });

  it('the import refuses more than 1 MB before reading it (413 with a sentence)', async () => {
    const r = await bigPost('/api/designs/import', false);
    console.log(`[body-limits] import, streamed without a length: ${r.status} after ${r.sentMb.toFixed(0)} MB written`);
    expect(r.status).toBe(413);
    const declared = await client.fetch('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: Buffer.alloc(1024 * 1024 + 10, 0x20) });
    expect(declared.status).toBe(413);
    expect((await declared.json()).error).toMatch(/at most 1 MB/);
  });
});
