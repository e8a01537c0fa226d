/**
 * Builds scripts/bench/engine.ts with esbuild and runs it: the engine compiled as the
 * production build compiles it (no keepNames, see engine.ts), not as tsx does. The bundle is
 * written under node_modules/.cache so its own requires resolve from the project.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { buildSync } from 'esbuild';

const root = path.resolve(__dirname, '../..');

export const runEngineBench = async (only: string | undefined, keepNames: boolean) => {
  const outDir = path.join(root, 'node_modules/.cache/phasewright-bench');
  mkdirSync(outDir, { recursive: true });
  const outfile = path.join(outDir, keepNames ? 'engine-keep-names.cjs' : 'engine.cjs');
  buildSync({
    entryPoints: [path.join(root, 'scripts/bench/engine.ts')],
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: `node${process.versions.node}`,
    alias: { '@': root },
    keepNames,
    outfile,
    logLevel: 'warning',
  });
  const mod = (await import(pathToFileURL(outfile).href)) as { engineSection?: typeof import('./engine').engineSection; default?: { engineSection: typeof import('./engine').engineSection } };
  const engineSection = mod.engineSection ?? mod.default!.engineSection;
  engineSection(only, keepNames ? 'bundled with keepNames, as tsx compiles' : 'bundled by esbuild without keepNames, as the production build compiles it');
};
