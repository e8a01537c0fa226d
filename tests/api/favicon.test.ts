/** Every page names an icon and the browser's default /favicon.ico request is served (no 404 in the console). */
import { describe, expect, inject, it } from 'vitest';
import { Client, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');

describe('favicon', () => {
  it('/favicon.ico answers 200 with an icon, without a session', async () => {
    const res = await new Client(baseUrl).fetch('/favicon.ico');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/image\/(x-icon|vnd\.microsoft\.icon)/);
    expect((await res.arrayBuffer()).byteLength).toBeGreaterThan(100);
  });

  it('the sign-in page and an app page link an icon that loads', async () => {
    const designer = await signedInAs(baseUrl, 'designer');
    for (const [client, path] of [
      [new Client(baseUrl), '/signin'],
      [designer, '/designs'],
    ] as const) {
      const html = await (await client.fetch(path)).text();
      const href = /<link rel="icon" href="([^"]+)"/.exec(html)?.[1];
      expect(href, path).toBeTruthy();
      const icon = await client.fetch(href!.replace(/&amp;/g, '&'));
      expect(icon.status).toBe(200);
    }
  });
});
