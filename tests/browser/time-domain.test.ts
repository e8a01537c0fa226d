/**
 * Tune's closed-loop view in Chromium: a designer switches to it, reads the closed-loop
 * impedance and line rejection, changes the step with the form, runs the switching check in
 * the Web Worker (progress, then points with the model's error), saves; the step comes back
 * with the revision, and Compare overlays both revisions' step responses. Screenshots go to
 * $SCREENSHOT_DIR.
 */
import { describe, expect, inject, it } from 'vitest';
import { chromiumAvailable } from '../support/chromium';
import { browserWithSavedDesign, screenshot } from '../support/browser';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
describe.runIf(run)('Tune: closed loop and step', () => {
  const suite = browserWithSavedDesign(baseUrl, 'Browser step rail');

  it('shows the closed loop, the step, the switching check, and keeps the step with the revision', async () => {
    const page = await suite.pageAs('designer@demo.test');
    page.on('console', (m) => (m.type() === 'error' ? console.log('[browser]', m.text()) : undefined));
    page.on('pageerror', (e) => console.log('[page error]', e.message));
    await page.goto(`${baseUrl}/designs/${suite.designId}`);
    await page.locator('[data-plot-ready="true"]').first().waitFor({ timeout: 60_000 });
    await page.getByTestId('tune-view-time').click();
    await page.getByTestId('time-domain-view').waitFor();
    await expect.poll(() => page.getByTestId('closed-loop-readouts').textContent()).toMatch(/Ω at/);
    await expect.poll(() => page.getByTestId('step-readouts').textContent()).toMatch(/Peak deviation/);
    await screenshot(page, 'time-domain-open');

    await page.locator('#step-to').fill('2.5');
    await page.locator('#step-rise').fill('2u');
    await page.getByTestId('step-apply').click();
    await page.getByTestId('run-model-check').click();
    await page.getByTestId('switching-progress').waitFor({ timeout: 30_000 });
    await screenshot(page, 'time-domain-progress');
    await page.getByTestId('model-check-table').waitFor({ timeout: 120_000 });
    // Computed in the Web Worker of the production build, not by the page's fallback.
    expect(await page.getByTestId('model-check-summary').getAttribute('data-computed-in')).toBe('worker');
    const rows = await page.getByTestId('model-check-table').locator('tbody tr').count();
    expect(rows).toBeGreaterThanOrEqual(5);
    await page.getByTestId('run-switching-step').click();
    await page.getByTestId('switching-step-summary').waitFor({ timeout: 120_000 });
    await screenshot(page, 'time-domain-checked');

    await page.getByLabel('Revision note').fill('step to 2.5 A').catch(() => undefined);
    await page.getByRole('button', { name: /^Save/ }).first().click();
    await expect.poll(async () => (await (await suite.designer.fetch(`/api/designs/${suite.designId}/revisions/2`)).json()).input?.step?.to ?? null, { timeout: 30_000 }).toBe(2.5);

    await page.goto(`${baseUrl}/designs/${suite.designId}/compare?a=1&b=2`);
    await page.getByTestId('step-compare').waitFor({ timeout: 60_000 });
    await screenshot(page, 'time-domain-compare');
  }, 400_000);
});
