/**
 * The operating range in Chromium: Tune draws the corners as a band, lists them with the worst
 * row highlighted, shows nominal and worst side by side and raises the worst-case checks; the
 * spread runs in a Web Worker with a progress bar, can be cancelled (the worker ends, the bar
 * goes, a note says so), and shows histograms;
 * an edited range is saved with the revision; Compare states both revisions' worst cases.
 * Screenshots go to $SCREENSHOT_DIR.
 */
import { describe, expect, inject, it } from 'vitest';
import { chromiumAvailable } from '../support/chromium';
import { browserWithSavedDesign, screenshot } from '../support/browser';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
describe.runIf(run)('Tune across the operating range', () => {
  const suite = browserWithSavedDesign(baseUrl, 'Browser range rail');

  it('shows corners, worst case and a cancellable spread with histograms; saves the range', async () => {
    const page = await suite.pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${suite.designId}`);
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    await page.getByTestId('corner-table').waitFor({ timeout: 60_000 });
    await expect.poll(() => page.getByTestId('corner-table').locator('tbody tr').count()).toBe(32);
    await expect.poll(() => page.locator('[data-worst="pm"]').count()).toBe(1);
    await expect.poll(() => page.getByTestId('worst-pm').textContent()).toMatch(/\d+\.\d°/);
    await expect.poll(() => page.getByTestId('worst-where').textContent()).toMatch(/Worst PM at corner \d+: /);
    expect(await page.locator('[data-check="worst-phase-margin"]').count()).toBe(1);

    // Cancel a long run: the worker is ended, the bar goes, a note says so, no result comes.
    await page.getByLabel('Samples').selectOption('100000');
    const workersBefore = page.workers().length;
    await page.getByTestId('spread-run').click();
    await page.getByTestId('spread-progress').waitFor();
    await expect.poll(() => page.workers().length).toBe(workersBefore + 1);
    await expect.poll(async () => Number(await page.getByTestId('spread-progress').getAttribute('aria-valuenow')), { timeout: 30_000 }).toBeGreaterThan(0);
    await page.getByTestId('spread-cancel').click();
    await page.getByTestId('spread-cancelled').waitFor();
    expect(await page.getByTestId('spread-cancelled').textContent()).toMatch(/Spread cancelled after [\d,]+ of 100,000 samples/);
    expect(await page.getByTestId('spread-progress').count()).toBe(0);
    await expect.poll(() => page.workers().length).toBe(workersBefore);
    await page.waitForTimeout(1500);
    expect(await page.getByTestId('spread-result').count()).toBe(0);
    await page.getByTestId('spread-run').waitFor();

    // Run 10,000 samples: a progress bar while the worker runs, then the histograms.
    await page.getByLabel('Samples').selectOption('10000');
    await page.getByTestId('spread-run').click();
    await page.getByTestId('spread-result').waitFor({ timeout: 60_000 });
    await page.getByTestId('hist-pm').waitFor({ state: 'visible' });
    expect(await page.getByTestId('spread-cancelled').count()).toBe(0);
    const box = await page.getByTestId('hist-pm').boundingBox();
    expect(box?.height).toBeGreaterThan(100);
    await expect.poll(() => page.getByTestId('spread-share').textContent()).toMatch(/% of 10,000 simulated builds meet/);
    await page.getByTestId('corners-family').check();
    await screenshot(page, 'range-tune');

    // Edit the range and save: the revision keeps it.
    await page.locator('#range-lTol').fill('30');
    await page.getByTestId('revision-note').fill('L ±30 %');
    await page.getByRole('button', { name: 'Save as r2' }).click();
    await expect
      .poll(async () => {
        const res = await suite.designer.fetch(`/api/designs/${suite.designId}/revisions`);
        const list = (await res.json()).revisions as { number: number }[];
        return list.length;
      })
      .toBe(2);
    const r2 = await (await suite.designer.fetch(`/api/designs/${suite.designId}/revisions/2`)).json();
    expect(r2.input.range.l.tol).toBe(0.3);

    await page.goto(`${baseUrl}/designs/${suite.designId}/compare?a=1&b=2`);
    await page.getByTestId('range-compare').waitFor();
    expect(await page.getByTestId('range-compare').textContent()).toContain('Worst phase margin');
    await screenshot(page, 'range-compare');
  });
});
