#!/usr/bin/env node
/**
 * Compress the build's static JavaScript and CSS once, at build time: writes `file.br` (quality 9: 11 takes over a minute for Plotly on a busy 2-core machine)
 * and `file.gz` (level 9) beside each file under <distDir>/static, which scripts/serve.mjs sends
 * as they are. Without this, every cold request would gzip the files again (Plotly's 4.6 MB
 * chunk costs ~150 ms of server CPU each time). Runs after `next build` (npm's postbuild, the
 * tests' build, `npm run demo`); skips files already done.
 *
 * It first copies plotly.js-dist-min's bundle to <distDir>/static/vendor/plotly-<version>.min.js
 * (lib/plotly-asset.ts names it): pages with a plot preload that file early and evaluate it after
 * their first picture, which a bundler's lazy chunk (fetched and evaluated in one go) cannot do.
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { createRequire } from 'node:module';
import { promisify } from 'node:util';

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);
export const COMPRESSIBLE = /\.(js|css|json|svg|txt)$/;

function* walk(dir) {
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) yield* walk(p);
    else if (COMPRESSIBLE.test(e.name)) yield p;
  }
}

/** Copy Plotly's browser bundle into the build's static files (see above); returns its path. */
export function copyPlotly(distDir) {
  const pkgDir = path.dirname(createRequire(import.meta.url).resolve('plotly.js-dist-min/package.json'));
  const { version } = JSON.parse(fs.readFileSync(path.join(pkgDir, 'package.json'), 'utf8'));
  const dest = path.join(distDir, 'static', 'vendor', `plotly-${version}.min.js`);
  if (!fs.existsSync(dest)) {
    fs.mkdirSync(path.dirname(dest), { recursive: true });
    fs.copyFileSync(path.join(pkgDir, 'plotly.min.js'), dest);
  }
  return dest;
}

export async function precompress(distDir) {
  const root = path.join(distDir, 'static');
  if (!fs.existsSync(root)) throw new Error(`${root} not found: build first`);
  copyPlotly(distDir);
  let files = 0;
  let bytes = 0;
  const jobs = [];
  for (const file of walk(root)) {
    const size = fs.statSync(file).size;
    if (size < 1024 || (fs.existsSync(`${file}.br`) && fs.existsSync(`${file}.gz`))) continue;
    jobs.push(
      (async () => {
        const buf = fs.readFileSync(file);
        const [br, gz] = await Promise.all([
          brotli(buf, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 9, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: buf.length } }),
          gzip(buf, { level: 9 }),
        ]);
        fs.writeFileSync(`${file}.br`, br);
        fs.writeFileSync(`${file}.gz`, gz);
        files++;
        bytes += size;
      })(),
    );
  }
  await Promise.all(jobs);
  return { files, bytes };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const distDir = process.env.NEXT_DIST_DIR || '.next';
  const t = Date.now();
  const { files, bytes } = await precompress(distDir);
  console.log(`› Precompressed ${files} static files (${(bytes / 1e6).toFixed(1)} MB) in ${distDir}/static in ${((Date.now() - t) / 1000).toFixed(1)} s`);
}
