/**
 * Where the browser fetches Plotly from. The build copies plotly.js-dist-min's own bundle to
 * `<distDir>/static/vendor/` under this name (scripts/precompress.mjs, which also compresses it
 * once), so a page can ask for it early with `<link rel="preload">` and evaluate it later, when
 * it chooses. The version in the name keeps the year-long cache of /_next/static honest;
 * tests/lib/plotly-asset.test.ts fails when it no longer matches the installed package.
 */
export const PLOTLY_VERSION = '4.1.2';
export const PLOTLY_SCRIPT_PATH = `/_next/static/vendor/plotly-${PLOTLY_VERSION}.min.js`;
