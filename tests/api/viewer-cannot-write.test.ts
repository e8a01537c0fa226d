/**
 * "No route lets a viewer write": every route handler file that exports a
 * mutating method is called as the demo viewer and must answer 403 (or 401/404
 * for a route that hides itself). Routes that write nothing are allow-listed.
 */
import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { Client, signedInAs } from '../support/http';

const baseUrl = inject('baseUrl');
const API = path.resolve(import.meta.dirname, '../../app/api');

// Writes nothing on the server's data, or only the caller's own session.
const READ_ONLY = new Set(['/api/analyze', '/api/analyze/corners', '/api/analyze/spread', '/api/session/team']);

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return routeFiles(p);
    return e.name === 'route.ts' ? [p] : [];
  });
}

const mutating = routeFiles(API)
  .filter((f) => !f.includes('[...nextauth]'))
  .flatMap((file) => {
    const src = fs.readFileSync(file, 'utf8');
    const route = '/api/' + path.relative(API, path.dirname(file)).split(path.sep).join('/');
    return ['POST', 'PUT', 'PATCH', 'DELETE']
      .filter((m) => new RegExp(`export (const|async function|function) ${m}\\b|as ${m}\\b`).test(src))
      .map((method) => ({ method, route }));
  })
  .filter((r) => !READ_ONLY.has(r.route));

let viewer: Client;
let designId: number;

beforeAll(async () => {
  viewer = await signedInAs(baseUrl, 'viewer');
  designId = (await (await viewer.fetch('/api/designs')).json()).designs[0].id;
});

describe('a viewer cannot write through any route', () => {
  it('found the mutating routes', () => {
    expect(mutating.length).toBeGreaterThanOrEqual(2);
  });

  it.each(mutating)('$method $route → 403', async ({ method, route }) => {
    const url = route
      .replace('[id]', String(designId))
      .replace('[number]', '1')
      .replace(/\[[^\]]+\]/g, '1');
    const res = await viewer.json(url, method, {});
    expect(res.status, `${method} ${url}`).toBe(403);
  });
});
