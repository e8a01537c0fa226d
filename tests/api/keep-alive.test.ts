/**
 * Idle kept-alive connections stay open past Node's 5 s default (scripts/serve.mjs sets 65 s,
 * above a proxy's usual 60 s idle timeout: common practice). With 5 s, a client that sent its
 * next POST just as the server closed the idle socket got "other side closed" — which no
 * client may resend for a POST (seen as resends in the fuzz test before the change).
 */
import http from 'node:http';
import { describe, expect, inject, it } from 'vitest';

const baseUrl = inject('baseUrl');

function get(agent: http.Agent, path: string): Promise<{ status: number; keepAlive: string | undefined; reused: boolean }> {
  return new Promise((resolve, reject) => {
    const req = http.get(new URL(path, baseUrl), { agent }, (res) => {
      res.resume();
      res.on('end', () => resolve({ status: res.statusCode ?? 0, keepAlive: String(res.headers['keep-alive'] ?? ''), reused: req.reusedSocket }));
    });
    req.on('error', reject);
  });
}

describe('kept-alive connections', () => {
  it('the server announces a 65 s idle timeout and a socket idle for 6 s is reused', { timeout: 30_000 }, async () => {
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const first = await get(agent, '/api/auth/csrf');
    expect(first.status).toBe(200);
    expect(Number(first.keepAlive?.match(/timeout=(\d+)/)?.[1])).toBeGreaterThanOrEqual(60);
    await new Promise((r) => setTimeout(r, 6_000));
    const second = await get(agent, '/api/auth/csrf');
    expect(second.status).toBe(200);
    expect(second.reused).toBe(true);
    agent.destroy();
  });
});
