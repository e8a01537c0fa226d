/**
 * Sign-in abuse, on a server of this test's own (low limits, so the shared
 * server's sign-ins are untouched): failed attempts limited per account and
 * per address (429 + Retry-After, and the right password waits too); an
 * unknown e-mail costs the same time as a known one; a flood of failed
 * sign-ins does not stall other users (p99 of GET /api/designs/[id], printed);
 * an empty auth-secret file is replaced instead of making every request 500.
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../support/app-server';
import { Client, DEMO_PASSWORD } from '../support/http';

let app: RunningApp;
let secretFile = '';

beforeAll(async () => {
  app = await startApp(
    {
      NEXTAUTH_SECRET: '',
      PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_ACCOUNT: '5',
      PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_IP: '12',
      PHASEWRIGHT_SIGNIN_WINDOW_SECONDS: '600',
      PHASEWRIGHT_TRUST_PROXY: '1',
    },
    (dir) => {
      secretFile = path.join(dir, 'auth-secret');
      fs.writeFileSync(secretFile, ''); // the empty secret file that used to make every request 500
    },
  );
}, 120_000);
afterAll(() => app?.stop());

let nextAddress = 1;
/** A sign-in attempt from its own made-up client address (PHASEWRIGHT_TRUST_PROXY=1 on this server). */
async function attempt(email: string, password: string, address = `10.9.${Math.floor(nextAddress / 250)}.${nextAddress++ % 250}`) {
  const c = new Client(app.baseUrl);
  const { csrfToken } = await (await c.fetch('/api/auth/csrf')).json();
  const started = performance.now();
  const res = await c.fetch('/api/auth/callback/credentials', {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-forwarded-for': address },
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }),
  });
  const ms = performance.now() - started;
  const signedIn = res.headers.getSetCookie().some((k) => k.startsWith('next-auth.session-token='));
  return { status: res.status, retryAfter: res.headers.get('retry-after'), ms, signedIn };
}

const percentile = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)];
};

describe('auth secret', () => {
  it('an empty secret file is replaced by a new secret; the app answers', async () => {
    expect((await fetch(`${app.baseUrl}/api/auth/csrf`)).status).toBe(200);
    expect(fs.readFileSync(secretFile, 'utf8').length).toBeGreaterThanOrEqual(32);
    expect(fs.statSync(secretFile).mode & 0o777).toBe(0o600);
  });
});

describe('sign-in limits', () => {
  it('per account: after 5 failures → 429 with Retry-After, even with the right password', async () => {
    const results = [];
    for (let i = 0; i < 7; i++) results.push(await attempt('viewer@demo.test', `wrong-${i}`));
    console.log(`[signin] per account: ${results.map((r) => r.status).join(' ')}`);
    expect(results.slice(0, 5).every((r) => r.status === 401)).toBe(true);
    expect(results[5].status).toBe(429);
    expect(Number(results[5].retryAfter)).toBeGreaterThan(0);
    const right = await attempt('viewer@demo.test', DEMO_PASSWORD);
    expect(right.status).toBe(429);
    expect(right.signedIn).toBe(false);
  });

  it('per address: after 12 failures from one address → 429 for any account from it', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 13; i++) statuses.push((await attempt(`someone-${i}@nowhere.test`, 'x', '10.200.0.1')).status);
    console.log(`[signin] per address: ${statuses.join(' ')}`);
    expect(statuses.slice(0, 12).every((s) => s === 401)).toBe(true);
    expect(statuses[12]).toBe(429);
    expect((await attempt('designer@demo.test', DEMO_PASSWORD, '10.200.0.1')).status).toBe(429);
    // another address still signs in
    expect((await attempt('designer@demo.test', DEMO_PASSWORD, '10.200.0.2')).signedIn).toBe(true);
  });

  it('an unknown e-mail takes as long as a known one with a wrong password (no account discovery)', async () => {
    const known: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 6; i++) {
      known.push((await attempt(i % 2 ? 'admin@demo.test' : 'reviewer@demo.test', `wrong-${i}`)).ms);
      unknown.push((await attempt(`ghost-${i}@demo.test`, `wrong-${i}`)).ms);
    }
    const [k, u] = [percentile(known, 50), percentile(unknown, 50)];
    console.log(`[signin] median failed sign-in: known e-mail ${k.toFixed(1)} ms, unknown e-mail ${u.toFixed(1)} ms, ratio ${(k / u).toFixed(2)}`);
    expect(k / u).toBeLessThan(2);
    expect(k / u).toBeGreaterThan(0.5);
  });

  it('16 parallel failed sign-ins do not stall other requests (p99 printed)', async () => {
    const reader = new Client(app.baseUrl);
    expect((await reader.signIn('designer@demo.test', DEMO_PASSWORD)).signedIn).toBe(true);
    const { designs } = await (await reader.fetch('/api/designs')).json();
    const url = `/api/designs/${designs[0].id}`;
    const sample = async (n: number) => {
      const ms: number[] = [];
      for (let i = 0; i < n; i++) {
        const t = performance.now();
        expect((await reader.fetch(url)).status).toBe(200);
        ms.push(performance.now() - t);
      }
      return ms;
    };
    await sample(10); // warm
    const idle = await sample(60);
    let flooding = true;
    let failed = 0;
    const flood = Array.from({ length: 16 }, async () => {
      while (flooding) {
        await attempt(`flood-${nextAddress}@nowhere.test`, 'wrong');
        failed++;
      }
    });
    await new Promise((r) => setTimeout(r, 300));
    const busy = await sample(60);
    flooding = false;
    await Promise.all(flood);
    const [idleP99, busyP99] = [percentile(idle, 99), percentile(busy, 99)];
    console.log(
      `[signin] GET ${url} p50/p99: idle ${percentile(idle, 50).toFixed(1)}/${idleP99.toFixed(1)} ms; during 16 parallel failed sign-ins ${percentile(busy, 50).toFixed(1)}/${busyP99.toFixed(1)} ms (${(busyP99 / idleP99).toFixed(2)}× idle; ${failed} failed sign-ins meanwhile)`,
    );
    // Before: ~3.7 s under the same flood (about 90× idle). The target is 3× idle; a shared, busy
    // test machine gets a floor of 1.5 s so its own noise does not fail the test.
    expect(busyP99).toBeLessThan(Math.max(3 * idleP99, 1500));
  });
});
