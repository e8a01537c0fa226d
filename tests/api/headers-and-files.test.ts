/**
 * Security headers on every page (frame-ancestors none, X-Frame-Options, a
 * content security policy that keeps scripts, styles and fonts to this origin, inline scripts
 * only with the response's nonce)
 * and the database files readable by their owner only.
 */
import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signedInAs, type Client } from '../support/http';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let designer: Client;

beforeAll(async () => {
  designer = await signedInAs(baseUrl, 'designer');
});

describe('security headers', () => {
  it('API answers: no framing, no sniffing', async () => {
    const res = await designer.fetch('/api/designs');
    expect(res.headers.get('x-frame-options')).toBe('DENY');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
  });

  it.each(['/signin', '/designs', '/cautions'])('%s', async (page) => {
    const res = await designer.fetch(page);
    const csp = res.headers.get('content-security-policy') ?? '';
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).not.toContain('unsafe-eval');
    expect(csp).toMatch(/font-src 'self'/);
    expect(res.headers.get('x-frame-options')).toBe('DENY');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
  });

  it.each(['/signin', '/designs', '/no-such-page'])('%s: scripts need this response\'s nonce, never unsafe-inline', async (page) => {
    const [a, b] = [await designer.fetch(page), await designer.fetch(page)];
    const scriptSrc = (res: Response) => (res.headers.get('content-security-policy') ?? '').split('; ').find((d) => d.startsWith('script-src ')) ?? '';
    expect(scriptSrc(a)).not.toContain('unsafe-inline');
    const nonce = scriptSrc(a).match(/'nonce-([A-Za-z0-9+/=]+)'/)?.[1];
    expect(nonce, scriptSrc(a)).toBeTruthy();
    expect(scriptSrc(b)).not.toBe(scriptSrc(a)); // fresh per response
    const html = await a.text();
    const inline = [...html.matchAll(/<script(?![^>]*\ssrc=)([^>]*)>/g)].map((m) => m[1]);
    expect(inline.length).toBeGreaterThan(0);
    for (const attrs of inline) expect(attrs).toContain(`nonce="${nonce}"`);
  });
});

describe('files', () => {
  it('the database and its WAL files are owner-only (0600)', () => {
    for (const f of [dbPath, `${dbPath}-wal`, `${dbPath}-shm`].filter((x) => fs.existsSync(x))) {
      expect((fs.statSync(f).mode & 0o777).toString(8), path.basename(f)).toBe('600');
    }
  });
});
