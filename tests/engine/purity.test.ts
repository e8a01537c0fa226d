import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

/** The engine stays pure (STYLE "What to absorb" 1): no framework, UI, validation or DB imports. */
const FORBIDDEN = /^(react|react-dom|next|next-auth|drizzle-orm|drizzle-kit|zod|better-sqlite3|server-only|@\/db|@\/app|@\/components)(\/|$)/;

const importsOf = (file: string) =>
  [...readFileSync(file, 'utf8').matchAll(/(?:import|export)[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)/g)].map(
    (m) => m[1] ?? m[2] ?? m[3],
  );

describe('engine purity', () => {
  for (const dir of ['lib/engine', 'lib/units']) {
    const files = readdirSync(dir).filter((f) => f.endsWith('.ts'));
    it(`${dir} has files to scan`, () => expect(files.length).toBeGreaterThan(0));
    for (const f of files) {
      it(`${dir}/${f} imports nothing from react, next, drizzle, zod or the db`, () => {
        const bad = importsOf(path.join(dir, f)).filter((m) => FORBIDDEN.test(m) || m.includes('/db/'));
        expect(bad).toEqual([]);
      });
    }
  }
});
