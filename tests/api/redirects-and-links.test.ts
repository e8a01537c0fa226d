/**
 * After sign-in only same-origin paths (no /\evil.example, no /%09/evil.example);
 * links in notification mail come from the configured public URL, never from
 * a request's Host or X-Forwarded-Host header.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { listMailTo } from '@/db/queries';
import { safeCallbackUrl } from '@/lib/safe-redirect';
import { signedInAs, type Client } from '../support/http';
import { savedDesign } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let designer: Client;
let reviewerId: number;

beforeAll(async () => {
  designer = await signedInAs(baseUrl, 'designer');
  const reviewer = await signedInAs(baseUrl, 'reviewer');
  reviewerId = (await (await reviewer.fetch('/api/auth/session')).json()).user.id;
});

const OFF_SITE = ['/%5Cevil.example', '/%09/evil.example', '//evil.example', 'https://evil.example/', '/%5C%5Cevil.example', '/%2F%2Fevil.example', 'javascript:alert(1)'];

describe('callbackUrl', () => {
  it.each(OFF_SITE)('/signin?callbackUrl=%s sends a signed-in user to a path of this site', async (cb) => {
    const res = await designer.fetch(`/signin?callbackUrl=${cb}`);
    expect(res.status).toBe(307);
    const location = res.headers.get('location') ?? '';
    expect(location).toBe('/designs');
  });

  it('keeps a same-origin path with its query', async () => {
    const res = await designer.fetch(`/signin?callbackUrl=${encodeURIComponent('/designs/1/history?r=2')}`);
    expect(res.headers.get('location')).toBe('/designs/1/history?r=2');
  });

  it.each([
    ['/\\evil.example', '/designs'],
    ['/\tevil', '/designs'],
    ['/ok?x=1#h', '/ok?x=1#h'],
    ['/%2F%2Fevil.example', '/designs'],
  ])('safeCallbackUrl(%j) = %j', (raw, want) => {
    expect(safeCallbackUrl(raw)).toBe(want);
  });
});

describe('links in mail', () => {
  it('use the configured public URL even when the request names another host', async () => {
    const { designId } = await savedDesign(designer, 'Link host rail');
    const res = await designer.fetch(`/api/designs/${designId}/revisions/1/submit`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-forwarded-host': 'evil.example', 'x-forwarded-proto': 'https' },
      body: JSON.stringify({ reviewerId, message: `host check ${designId}` }),
    });
    expect(res.status).toBe(201);
    const db = openDatabase(dbPath);
    const mail = listMailTo(db, 'reviewer@demo.test').find((m) => m.text.includes(`host check ${designId}`));
    db.$client.close();
    expect(mail?.text).toContain(`${baseUrl}/designs/${designId}/history?r=1`);
    expect(mail?.text).not.toContain('evil.example');
    expect(mail?.html).not.toContain('evil.example');
  });
});
