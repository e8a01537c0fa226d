/**
 * A design with 250 revisions in Chromium: Tune's revision picker opens with the page holding the
 * revision shown (100 links) and pages through the rest; Compare's pickers list a page each and
 * page on demand; Compare's remarks show 100 a page with the page in the address (Back returns).
 * Revisions and remarks are written through the query functions, not 250 HTTP saves.
 */
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signedInPage } from '../support/browser';
import { signedInAs } from '../support/http';
import { addRemarks, addRevisions } from '../support/many-revisions';
import { savedDesign } from '../support/saved-design';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let browser: Browser;
let designId: number;

const chips = async (page: Page) => (await page.getByTestId('revision-chips').getByRole('link').allTextContents()).map((t) => Number(t.slice(1)));
const range = (from: number, to: number) => Array.from({ length: to - from + 1 }, (_, i) => from + i);
const options = async (page: Page, testId: string) => page.getByTestId(testId).locator('option').allTextContents();

describe.runIf(run)('revision pickers and remarks with more than a page', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const designer = await signedInAs(baseUrl, 'designer');
    ({ designId } = await savedDesign(designer, 'Browser long history rail'));
    expect(addRevisions(dbPath, designId, 249)).toBe(250);
    addRemarks(dbPath, designId, 250, 130);
  });
  afterAll(async () => browser?.close());

  it('Tune lists the newest 100 revisions, pages to older ones, and opens an old one on its own page', async () => {
    const page = await signedInPage(browser, baseUrl, 'designer@demo.test');
    await page.goto(`${baseUrl}/designs/${designId}`);
    const picker = page.getByTestId('revision-picker');
    await picker.waitFor();
    expect(await chips(page)).toEqual(range(151, 250));
    expect(await picker.locator('[aria-current="page"]').textContent()).toBe('r250');
    expect(await page.getByTestId('revisions-range').textContent()).toBe('r151–r250 of 250');
    await screenshot(page, 'paging-tune-latest');

    await page.getByTestId('revisions-older').click();
    await expect.poll(() => chips(page)).toEqual(range(51, 150));
    await page.getByTestId('revisions-older').click();
    await expect.poll(() => chips(page)).toEqual(range(1, 50));
    expect(await page.getByTestId('revisions-older').isDisabled()).toBe(true);
    await page.getByTestId('revision-chips').getByRole('link', { name: 'r7', exact: true }).click();
    await page.waitForURL(/\?r=7$/);
    await expect.poll(async () => (await page.getByTestId('revision-picker').locator('[aria-current="page"]').textContent()) ?? '').toBe('r7');
    expect(await chips(page)).toEqual(range(1, 50));
    await page.getByTestId('revisions-newer').click();
    await expect.poll(() => chips(page)).toEqual(range(51, 150));
    await screenshot(page, 'paging-tune-old');

    await page.goto(`${baseUrl}/designs/${designId}?r=120`);
    await page.getByTestId('revision-picker').waitFor();
    expect(await chips(page)).toEqual(range(51, 150));

    // Find by number: a number past the end is refused beside the box; r200 shows its page, marked.
    await page.getByTestId('revision-find').fill('r999');
    await page.getByRole('button', { name: 'Show' }).click();
    await expect.poll(() => page.getByRole('alert').filter({ hasText: 'Revisions run r1–r250' }).count()).toBe(1);
    await page.getByTestId('revision-find').fill('200');
    await page.getByRole('button', { name: 'Show' }).click();
    await expect.poll(() => chips(page)).toEqual(range(151, 250));
    expect(await page.locator('[data-found="true"]').textContent()).toBe('r200');
    await screenshot(page, 'paging-tune-find');
    await page.context().close();
  });

  it('Compare lists a page per picker, pages on demand, and pages the remarks with the page in the address', async () => {
    const page = await signedInPage(browser, baseUrl, 'reviewer@demo.test', { viewport: { width: 1400, height: 1000 } });
    await page.goto(`${baseUrl}/designs/${designId}/compare?a=5&b=250`);
    await page.getByTestId('compare').waitFor();
    expect(await page.getByTestId('compare-a').inputValue()).toBe('5');
    const a = await options(page, 'compare-a');
    expect(a[0]).toMatch(/newer/);
    expect(a.slice(1)).toEqual(range(1, 50).reverse().map((n) => `r${n}`));
    const b = await options(page, 'compare-b');
    expect(b.slice(0, 100)).toEqual(range(151, 250).reverse().map((n) => `r${n}`));
    expect(b[100]).toMatch(/older/);

    // A's list moves to newer revisions (keeping r5 chosen), then r120 is chosen.
    await page.getByTestId('compare-a').selectOption('newer');
    await expect.poll(() => options(page, 'compare-a')).toContain('r150');
    expect(await page.getByTestId('compare-a').inputValue()).toBe('5');
    await page.getByTestId('compare-a').selectOption('120');
    await page.waitForURL(/a=120&b=250/);
    await expect.poll(() => page.getByTestId('side-a').textContent()).toContain('A · r120');

    // Both numbers typed.
    await page.getByTestId('compare-type-a').fill('r33');
    await page.getByTestId('compare-type-b').fill('0');
    await page.getByRole('button', { name: 'Compare', exact: true }).click();
    await expect.poll(() => page.getByTestId('compare-type-error').textContent()).toBe('Revisions run r1–r250');
    await page.getByTestId('compare-type-b').fill('34');
    await page.getByRole('button', { name: 'Compare', exact: true }).click();
    await page.waitForURL(/a=33&b=34/);
    await expect.poll(() => page.getByTestId('side-b').textContent()).toContain('B · r34');
    await page.goto(`${baseUrl}/designs/${designId}/compare?a=120&b=250`);

    // B's remarks: 130, newest first, 100 a page.
    const listB = page.getByTestId('compare-remarks-b');
    await expect.poll(() => listB.locator('li').count()).toBe(100);
    expect(await listB.locator('li').first().textContent()).toContain('remark 130');
    expect(await page.getByTestId('compare-remarks-pager-b').textContent()).toContain('Page 1 of 2 · 130 remarks on r250');
    expect(await page.getByTestId('compare-remarks-a').textContent()).toContain('No remarks on r120 yet.');
    await screenshot(page, 'paging-compare');
    await page.getByTestId('compare-remarks-pager-b').getByRole('button', { name: 'Older →' }).click();
    await page.waitForURL(/remarksB=2/);
    await expect.poll(() => listB.locator('li').count()).toBe(30);
    expect(await listB.locator('li').last().textContent()).toContain('remark 1');
    await page.goBack();
    await page.waitForURL((u) => !u.search.includes('remarksB'));
    await expect.poll(() => listB.locator('li').count()).toBe(100);
    // The address holds the page: opening it serves page 2 from the server.
    await page.goto(`${baseUrl}/designs/${designId}/compare?a=120&b=250&remarksB=2`);
    await expect.poll(() => page.getByTestId('compare-remarks-b').locator('li').count()).toBe(30);
    await page.context().close();
  });
});
