import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

/**
 * Every route handler goes through the shared helpers of lib/api.ts: `withUser` for the
 * session and the error mapping, `parseJson` (a zod schema) for JSON bodies, `HttpError`
 * for expected failures. next-auth's own handler is the one exception.
 */
const EXEMPT = new Set(['app/api/auth/[...nextauth]/route.ts']);

function routes(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return routes(p);
    return name === 'route.ts' ? [p] : [];
  });
}

const files = routes('app/api').filter((f) => !EXEMPT.has(f));

describe('route handlers use the shared helpers', () => {
  it('finds the routes', () => expect(files.length).toBeGreaterThan(5));

  for (const file of files) {
    const src = readFileSync(file, 'utf8');
    const handlers = [...src.matchAll(/export\s+(?:const|async function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b\s*=?\s*([^\n]*)/g)];
    it(`${file}: every handler is wrapped in withUser`, () => {
      expect(handlers.length).toBeGreaterThan(0);
      for (const h of handlers) expect(h[2], `${h[1]} in ${file}`).toMatch(/^withUser\b/);
    });
    it(`${file}: reads JSON only through parseJson`, () => {
      expect(src).not.toMatch(/\breq(?:uest)?\.json\(\)/);
      expect(src).not.toMatch(/\.safeParse\(|(?<!JSON)\.parse\(/);
    });
    it(`${file}: answers errors through HttpError, not hand-built status codes`, () => {
      expect(src).not.toMatch(/status:\s*(4\d\d|5\d\d)/);
      expect(src).not.toMatch(/jsonError\(/);
    });
  }
});
