/**
 * Browser section of `npm run bench`: Debian's Chromium (playwright-core), each page in a fresh
 * context (cold browser cache) against the production build. Prints the JavaScript each page
 * transfers (compressed bytes on the wire, and whether Plotly is among it) and, on Tune, the time
 * from navigation start to the first drawn loop (the `phasewright:first-loop` mark) and to
 * Plotly's first draw.
 */
import fs from 'node:fs';
import { chromium, type Browser, type BrowserContext } from 'playwright-core';
import { buildIfStale, startApp } from '../../tests/support/app-server';
import { CHROMIUM, CHROMIUM_ARGS } from '../../tests/support/chromium';
import { signedInAs } from '../../tests/support/http';

const FIRST_LOOP_MARK = 'phasewright:first-loop';
export const JS_TARGET_BYTES = 160_000;
export const FIRST_LOOP_TARGET_MS = 1500;
const TUNE_RUNS = 3;

export interface PageJs {
  page: string;
  scripts: number;
  wireBytes: number;
  plotly: boolean;
  targetBytes?: number;
}

export interface BrowserResult {
  pages: PageJs[];
  /** ms from navigation start, one per cold run. */
  firstLoopMs: number[];
  plotlyDrawnMs: number[];
  /** Where the time to the first loop goes, per run (ms from navigation start). */
  phases: (Phases | null)[];
}

export interface Phases {
  responseStartMs: number;
  responseEndMs: number;
  scriptsLoadedMs: number;
  domContentLoadedMs: number;
  plotlyFetchStartMs: number | null;
  plotlyFetchedMs: number | null;
}

async function measurePage(browser: Browser, url: string, cookies: Parameters<BrowserContext['addCookies']>[0], ready: (ctx: BrowserContext) => Promise<void>) {
  const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  if (cookies.length) await ctx.addCookies(cookies);
  const page = await ctx.newPage();
  const pending: Promise<{ bytes: number; plotly: boolean }>[] = [];
  page.on('requestfinished', (req) => {
    if (req.resourceType() !== 'script') return;
    pending.push(
      (async () => {
        const sizes = await req.sizes();
        const res = await req.response();
        // Only Plotly's chunk names the global it defines.
        const body = res ? await res.body() : Buffer.alloc(0);
        return { bytes: sizes.responseBodySize, plotly: body.includes('Plotly') };
      })(),
    );
  });
  await page.goto(url, { waitUntil: 'load' });
  await ready(ctx);
  await page.waitForLoadState('networkidle');
  const scripts = await Promise.all(pending);
  const timing = await page.evaluate((mark) => {
    const first = performance.getEntriesByName(mark)[0];
    const drawn = performance.getEntriesByName('phasewright:plotly-drawn')[0];
    const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming | undefined;
    const scripts = performance.getEntriesByType('resource').filter((r) => (r as PerformanceResourceTiming).initiatorType === 'script' || r.name.endsWith('.js')) as PerformanceResourceTiming[];
    const pageScripts = scripts.filter((r) => !r.name.includes('/vendor/plotly-'));
    const plotly = scripts.find((r) => r.name.includes('/vendor/plotly-'));
    return {
      firstLoopMs: first ? first.startTime : null,
      plotlyDrawnMs: drawn ? drawn.startTime : null,
      phases: nav
        ? {
            responseStartMs: nav.responseStart,
            responseEndMs: nav.responseEnd,
            scriptsLoadedMs: pageScripts.reduce((m, r) => Math.max(m, r.responseEnd), 0),
            domContentLoadedMs: nav.domContentLoadedEventEnd,
            plotlyFetchedMs: plotly ? plotly.responseEnd : null,
            plotlyFetchStartMs: plotly ? plotly.startTime : null,
          }
        : null,
    };
  }, FIRST_LOOP_MARK);
  await ctx.close();
  return {
    scripts: scripts.length,
    wireBytes: scripts.reduce((s, x) => s + x.bytes, 0),
    plotly: scripts.some((x) => x.plotly),
    ...timing,
  };
}

export async function browserSection(): Promise<BrowserResult | null> {
  if (!fs.existsSync(CHROMIUM)) {
    if (process.env.CI === 'true') throw new Error(`Chromium is required in CI but ${CHROMIUM} is missing`);
    console.log(`\nBrowser: skipped (${CHROMIUM} not found; apt-get install chromium)`);
    return null;
  }
  const t = Date.now();
  buildIfStale();
  const app = await startApp();
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  try {
    const designer = await signedInAs(app.baseUrl, 'designer');
    const cookies = designer
      .cookieHeader()
      .split('; ')
      .filter(Boolean)
      .map((pair) => {
        const i = pair.indexOf('=');
        return { name: pair.slice(0, i), value: pair.slice(i + 1), url: app.baseUrl };
      });
    const list = (await (await designer.fetch('/api/designs?sort=name')).json()) as { designs: { id: number; latestRevision: number | null }[] };
    const design = list.designs.find((d) => d.latestRevision !== null);
    if (!design) throw new Error('no saved design to open on Tune');
    const tuneUrl = `${app.baseUrl}/designs/${design.id}`;
    const noWait = async () => {};
    const waitForPlotly = async (ctx: BrowserContext) => {
      await ctx.pages()[0].waitForFunction(() => performance.getEntriesByName('phasewright:plotly-drawn').length > 0, undefined, { timeout: 60_000 });
    };
    // One visit of each page first, so the server's first-use work is not counted.
    await measurePage(browser, `${app.baseUrl}/signin`, [], noWait);
    await measurePage(browser, `${app.baseUrl}/designs`, cookies, noWait);
    await measurePage(browser, tuneUrl, cookies, waitForPlotly);

    const signin = await measurePage(browser, `${app.baseUrl}/signin`, [], noWait);
    const designs = await measurePage(browser, `${app.baseUrl}/designs`, cookies, noWait);
    const tunes = [];
    for (let i = 0; i < TUNE_RUNS; i++) tunes.push(await measurePage(browser, tuneUrl, cookies, waitForPlotly));
    console.log(`  (browser section took ${((Date.now() - t) / 1000).toFixed(0)} s)`);
    return {
      pages: [
        { page: 'sign-in', scripts: signin.scripts, wireBytes: signin.wireBytes, plotly: signin.plotly, targetBytes: JS_TARGET_BYTES },
        { page: 'designs', scripts: designs.scripts, wireBytes: designs.wireBytes, plotly: designs.plotly, targetBytes: JS_TARGET_BYTES },
        { page: 'Tune', scripts: tunes[0].scripts, wireBytes: tunes[0].wireBytes, plotly: tunes[0].plotly },
      ],
      firstLoopMs: tunes.map((r) => r.firstLoopMs ?? NaN),
      plotlyDrawnMs: tunes.map((r) => r.plotlyDrawnMs ?? NaN),
      phases: tunes.map((r) => r.phases),
    };
  } finally {
    await browser.close();
    await app.stop();
  }
}

const kB = (b: number) => `${(b / 1000).toFixed(1)} kB`;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1];

export function printBrowser(r: BrowserResult | null) {
  if (!r) return;
  console.log('\nBrowser: Chromium, cold cache per page, production build (JavaScript as transferred, compressed)');
  for (const p of r.pages) {
    const target =
      p.targetBytes === undefined
        ? ''
        : `; target < ${kB(p.targetBytes)} without Plotly: ${p.wireBytes < p.targetBytes && !p.plotly ? 'within target' : 'ABOVE target'}`;
    console.log(`- ${p.page}: ${kB(p.wireBytes)} of JavaScript in ${p.scripts} files, Plotly ${p.plotly ? 'loaded' : 'not loaded'}${target}`);
  }
  const first = median(r.firstLoopMs);
  console.log(
    `- Tune, first drawn loop (SVG): median ${first.toFixed(0)} ms from navigation start (runs ${r.firstLoopMs.map((x) => x.toFixed(0)).join(', ')}); target ≤ ${FIRST_LOOP_TARGET_MS} ms: ${first <= FIRST_LOOP_TARGET_MS ? 'within target' : 'ABOVE target'}`,
  );
  console.log(`- Tune, Plotly's first draw: median ${median(r.plotlyDrawnMs).toFixed(0)} ms (runs ${r.plotlyDrawnMs.map((x) => x.toFixed(0)).join(', ')})`);
  const ms = (x: number | null | undefined) => (x === null || x === undefined ? '–' : x.toFixed(0));
  r.phases.forEach((p, i) => {
    if (!p) return;
    console.log(
      `  run ${i + 1}: HTML first byte ${ms(p.responseStartMs)}, HTML done ${ms(p.responseEndMs)}, page scripts fetched ${ms(p.scriptsLoadedMs)}, DOMContentLoaded ${ms(p.domContentLoadedMs)}, first loop ${ms(r.firstLoopMs[i])}; Plotly fetched ${ms(p.plotlyFetchStartMs)}–${ms(p.plotlyFetchedMs)}, drawn ${ms(r.plotlyDrawnMs[i])} ms`,
    );
  });
}
