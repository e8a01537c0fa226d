/**
 * The Plotly bundle the pages preload is the installed plotly.js-dist-min: the build copies it
 * under the name lib/plotly-asset.ts gives (scripts/precompress.mjs reads the package's version).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { PLOTLY_SCRIPT_PATH, PLOTLY_VERSION } from '@/lib/plotly-asset';

describe('Plotly asset', () => {
  it('names the installed version of plotly.js-dist-min', () => {
    const pkg = JSON.parse(fs.readFileSync(require.resolve('plotly.js-dist-min/package.json'), 'utf8')) as { version: string };
    expect(PLOTLY_VERSION).toBe(pkg.version);
  });

  it('is copied by the build step where the pages preload it from', async () => {
    const dist = fs.mkdtempSync(path.join(os.tmpdir(), 'phasewright-dist-'));
    try {
      const { copyPlotly } = await import('../../scripts/precompress.mjs');
      const dest = copyPlotly(dist);
      expect(path.relative(dist, dest).split(path.sep).join('/')).toBe(PLOTLY_SCRIPT_PATH.replace('/_next/', ''));
      expect(fs.statSync(dest).size).toBe(fs.statSync(require.resolve('plotly.js-dist-min')).size);
    } finally {
      fs.rmSync(dist, { recursive: true, force: true });
    }
  });
});
