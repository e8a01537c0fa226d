/**
 * Issue 6 in Chromium: a designer uploads bench data measured as −T on Handoff, is told so,
 * shifts it by 180°, reads the measured crossover and phase margin beside the model's, sees
 * the grey dots over the model on Handoff and on Tune; a bad file names its line; the
 * export buttons deliver the parts list and the netlist.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { benchCsvFor } from '../support/bench-file';
import { screenshot, signInThroughForm } from '../support/browser';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { signedInAs } from '../support/http';
import { savedDesign } from '../support/saved-design';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;
let designId: number;
let input: AnalyzeRequest;
let dir: string;

async function designerPage(): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 }, acceptDownloads: true });
  const page = await context.newPage();
  await signInThroughForm(page, baseUrl, 'designer@demo.test');
  return page;
}

describe.runIf(run)('Handoff: bench data and exports', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const saved = await savedDesign(await signedInAs(baseUrl, 'designer'), 'Browser handoff rail');
    designId = saved.designId;
    input = saved.input as unknown as AnalyzeRequest;
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'phasewright-bench-'));
  });
  afterAll(async () => {
    await browser?.close();
    if (dir) fs.rmSync(dir, { recursive: true, force: true });
  });

  it('uploads a measured loop, offers the 180° shift, shows measured margins and the overlay', async () => {
    const page = await designerPage();
    await page.goto(`${baseUrl}/designs/${designId}/handoff`);
    await page.getByTestId('handoff').waitFor();
    // Rendered by the client once the list is fetched: the upload form is live (hydrated).
    await page.getByText(/No bench data uploaded for r\d+ yet\./).waitFor({ timeout: 30_000 });

    // A bad file first: the message names the line, nothing is listed.
    const bad = path.join(dir, 'bad.csv');
    fs.writeFileSync(bad, 'Frequency (Hz),Gain (dB),Phase (deg)\n100,40,-90\n1000,30,-95\n500,20,-100\n');
    await page.setInputFiles('input[name=bench-file]', bad);
    await page.getByRole('button', { name: 'Upload' }).click();
    await expect.poll(() => page.getByTestId('bench-error').textContent(), { timeout: 30_000 }).toMatch(/line 4: frequency 500 Hz is below 1000 Hz on line 3/);

    const file = path.join(dir, 'loop-inverted.csv');
    fs.writeFileSync(file, benchCsvFor(input, { invert: true, gainOffsetDb: -1, phaseOffsetDeg: -2 }));
    await page.setInputFiles('input[name=bench-file]', file);
    await page.getByRole('button', { name: 'Upload' }).click();
    const detail = page.getByTestId('bench-detail');
    await detail.waitFor({ timeout: 30_000 });
    await expect.poll(() => detail.getByRole('alert').textContent()).toMatch(/looks measured as −T/);
    await screenshot(page, 'handoff-bench-inverted');

    await detail.getByRole('button', { name: 'Shift phase by 180°' }).click();
    await expect.poll(() => page.getByText('Shown with 180° taken off the phase').count(), { timeout: 15_000 }).toBe(1);
    // 2° less phase and, with 1 dB less gain, fc a little lower where the phase differs too:
    // the measured PM sits a few degrees below the model's.
    const pm = Number((await page.getByTestId('measured-pm').textContent())!.replace(/[^\d.-]/g, ''));
    const modelPm = Number((await page.getByTestId('bench-margins').locator('tr', { hasText: 'Phase margin' }).locator('td').nth(2).textContent())!.replace(/[^\d.-]/g, ''));
    expect(modelPm - pm).toBeGreaterThan(1);
    expect(modelPm - pm).toBeLessThan(5);
    expect(await page.getByTestId('measured-fc').textContent()).toMatch(/Hz$/);

    // Grey dots over the model line, and the difference plot.
    const overlay = page.getByTestId('bench-overlay');
    expect(await overlay.locator('g[data-series="Bench data"] circle').count()).toBe(240);
    expect(await overlay.locator('polyline').count()).toBe(2);
    expect(await page.getByTestId('bench-difference').locator('circle').count()).toBeGreaterThan(200);
    await screenshot(page, 'handoff-bench-shifted');
    await page.context().close();
  });

  it('shows the bench data on Tune as grey dots', async () => {
    const page = await designerPage();
    await page.goto(`${baseUrl}/designs/${designId}`);
    const plot = page.getByTestId('bode-plot');
    // 120 measured points on each panel, drawn as markers in the bench grey.
    await expect
      .poll(
        () =>
          plot
            .locator('.scatterlayer .trace path.point')
            .evaluateAll((ps) => ps.filter((p) => getComputedStyle(p).fill === 'rgb(107, 114, 128)').length),
        { timeout: 30_000 },
      )
      .toBeGreaterThanOrEqual(200);
    await screenshot(page, 'tune-bench-overlay');
    await page.context().close();
  });

  it('downloads the parts list and the netlist from the export buttons', async () => {
    const page = await designerPage();
    await page.goto(`${baseUrl}/designs/${designId}/handoff`);
    const buttons = page.getByTestId('export-buttons');
    const [csv] = await Promise.all([page.waitForEvent('download'), buttons.locator('[data-format=csv]').click()]);
    expect(csv.suggestedFilename()).toBe('browser-handoff-rail-r1-parts.csv');
    const text = fs.readFileSync((await csv.path())!, 'utf8');
    expect(text.split('\r\n')[0]).toMatch(/^Reference designator,Part,Role/);
    const [cir] = await Promise.all([page.waitForEvent('download'), buttons.locator('[data-format=spice]').click()]);
    expect(cir.suggestedFilename()).toBe('browser-handoff-rail-r1.cir');
    expect(await page.getByTestId('netlist').textContent()).toContain('.ac dec');
    await screenshot(page, 'handoff');
    await page.context().close();
  });
});
