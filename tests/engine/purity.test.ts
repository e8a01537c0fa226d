import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

/**
 * The engine stays pure: an allow-list of what lib/engine, lib/units and lib/catalog may
 * import. Anything else (a framework, the DB, a new package) fails until it is added here
 * on purpose.
 */
const ALLOWED: Record<string, RegExp[]> = {
  // The catalogue files it reads are pure data (checked below: they import only engine types).
  'lib/engine': [/^\.\/[\w-]+$/, /^complex\.js$/, /^@\/lib\/units\/si$/, /^@\/lib\/catalog\/(margins|stage-inputs|compensators|range-inputs)$/],
  'lib/units': [/^\.\/[\w-]+$/],
  // Pure data: only engine types and its own files.
  'lib/catalog': [/^\.\/[\w-]+$/, /^\.\.\/engine\/types$/],
};

const importsOf = (file: string) =>
  [...readFileSync(file, 'utf8').matchAll(/(?:import|export)[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)/g)].map(
    (m) => m[1] ?? m[2] ?? m[3],
  );

describe('engine purity (allow-list)', () => {
  for (const [dir, allowed] of Object.entries(ALLOWED)) {
    const files = readdirSync(dir).filter((f) => f.endsWith('.ts'));
    it(`${dir} has files to scan`, () => expect(files.length).toBeGreaterThan(0));
    for (const f of files) {
      it(`${dir}/${f} imports only what the allow-list names`, () => {
        const bad = importsOf(path.join(dir, f)).filter((m) => !allowed.some((re) => re.test(m)));
        expect(bad).toEqual([]);
      });
    }
  }

  it('the catalogue files the engine reads import nothing but engine types', () => {
    expect(importsOf('lib/catalog/margins.ts')).toEqual([]);
    expect(importsOf('lib/catalog/range-inputs.ts')).toEqual([]);
    for (const f of ['lib/catalog/stage-inputs.ts', 'lib/catalog/compensators.ts']) expect(importsOf(f)).toEqual(['../engine/types']);
  });
});
