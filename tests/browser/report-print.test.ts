/**
 * The printable report, printed by Chromium to PDF on A4 and on US Letter: a revision with
 * bench data, a sign-off trail and remarks. Counts the pages, and checks in print layout that
 * page 1 holds the margins and the whole loop plot (it used to leave page 1 40 % blank), that
 * no plot is taller than a page and that the sign-off badge stays on one line.
 */
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { benchCsvFor } from '../support/bench-file';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signInThroughForm } from '../support/browser';
import { signedInAs } from '../support/http';
import { savedDesign } from '../support/saved-design';
import type { AnalyzeRequest } from '@/lib/engine/types';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;
let designId: number;

/** Printable area at 96 px per inch with the report's @page margins (12 mm sides, 14 + 16 mm top and bottom). */
const PAPER = {
  A4: { widthPx: ((210 - 24) / 25.4) * 96, heightPx: ((297 - 30) / 25.4) * 96 },
  Letter: { widthPx: ((215.9 - 24) / 25.4) * 96, heightPx: ((279.4 - 30) / 25.4) * 96 },
} as const;

const pageCount = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;

describe.runIf(run)('printed report', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const designer = await signedInAs(baseUrl, 'designer');
    const reviewer = await signedInAs(baseUrl, 'reviewer');
    const reviewerId = (await (await reviewer.fetch('/api/auth/session')).json()).user.id;
    const saved = await savedDesign(designer, 'Printed report: 12 V probe supply with a long name that wraps');
    designId = saved.designId;
    const form = new FormData();
    form.set('file', new Blob([benchCsvFor(saved.input as unknown as AnalyzeRequest, { gainOffsetDb: -1, phaseOffsetDeg: -4 })], { type: 'text/csv' }), 'board-1.csv');
    form.set('name', 'Board 1 at 3.7 V in');
    expect((await designer.fetch(`/api/designs/${designId}/bench`, { method: 'POST', body: form })).status).toBe(201);
    const url = `/api/designs/${designId}/revisions/1`;
    expect((await designer.json(`${url}/submit`, 'POST', { reviewerId, message: 'Bench run attached; please check PM' })).status).toBe(201);
    for (const body of ['The measured crossover sits 1 kHz under the model: expected with the ESR tolerance.', 'Check again at 3.0 V in before the pilot run.'])
      expect((await reviewer.json(`${url}/remarks`, 'POST', { body })).status).toBe(201);
    expect((await reviewer.json(`${url}/decision`, 'POST', { decision: 'request-changes', message: 'Raise PM above 50° at low line' })).status).toBe(201);
  });
  afterAll(async () => browser?.close());

  it.each(['A4', 'Letter'] as const)('%s: the plots fit the page, page 1 is full, the badge stays on one line, and it prints on at most 8 pages', async (format) => {
    const paper = PAPER[format];
    const context = await browser.newContext({ viewport: { width: Math.round(paper.widthPx), height: Math.round(paper.heightPx) } });
    const page = await context.newPage();
    await signInThroughForm(page, baseUrl, 'viewer@demo.test');
    await page.goto(`${baseUrl}/api/designs/${designId}/revisions/1/export?format=report&inline=1`);
    await page.emulateMedia({ media: 'print' });

    const html = await page.content();
    expect(html).toContain('data-testid="report-bench"');
    expect(html).toContain('data-testid="report-trail"');
    expect(html).toContain('Check again at 3.0 V in before the pilot run.');

    const layout = await page.evaluate(() => {
      const box = (e: Element) => e.getBoundingClientRect();
      const badge = document.querySelector('[data-testid="report-signoff"]')!;
      return {
        badgeLines: badge.getClientRects().length,
        badgeHeight: box(badge).height,
        firstPlotBottom: box(document.querySelector('figure.plot')!).bottom,
        plotHeights: [...document.querySelectorAll('figure.plot svg')].map((s) => box(s).height),
      };
    });
    expect(layout.badgeLines).toBe(1);
    expect(layout.badgeHeight).toBeLessThan(24);
    expect(layout.firstPlotBottom).toBeLessThan(paper.heightPx);
    for (const h of layout.plotHeights) expect(h).toBeLessThan(paper.heightPx);
    await screenshot(page, `report-print-${format}`);

    const pdf = await page.pdf({ format, printBackground: true });
    const pages = pageCount(pdf);
    expect(pages).toBeGreaterThanOrEqual(2);
    // The report now also carries the operating range, the step response and the switching check.
    expect(pages).toBeLessThanOrEqual(8);
    await context.close();
  });
});
