/**
 * The designs list's views and the archive control in Chromium, on the demo data: the reviewer
 * finds the design waiting for them; a designer archives a design from its header and restores
 * it from the Archived view; a reviewer remarks on Compare and the author gets the mail.
 */
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { listMailTo } from '@/db/queries';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signedInPage } from '../support/browser';
import { signedInAs } from '../support/http';
import { savedDesign, tweak } from '../support/saved-design';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
let browser: Browser;

const pageAs = (email: string): Promise<Page> => signedInPage(browser, baseUrl, email, { viewport: { width: 1400, height: 1000 }, acceptDialogs: true });

describe.runIf(run)('designs list views, archive, remarks on Compare', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  });
  afterAll(async () => browser?.close());

  it('the reviewer finds the demo design waiting for their review', async () => {
    const page = await pageAs('reviewer@demo.test');
    await page.goto(`${baseUrl}/designs`);
    const tab = page.getByTestId('designs-view').getByRole('link', { name: /Waiting for my review \(\d+\)/ });
    await tab.click();
    await page.waitForURL(/waiting=me/);
    await expect.poll(() => page.getByTestId('designs-table').textContent()).toMatch(/5 V logic rail — arm controller/);
    await screenshot(page, 'designs-waiting');
    await page.context().close();
  });

  it('a designer archives a design from its header, finds it under Archived and restores it', async () => {
    const designer = await signedInAs(baseUrl, 'designer');
    const { designId } = await savedDesign(designer, 'Browser archive rail');
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${designId}/history`);
    await page.getByRole('button', { name: 'Archive design' }).click();
    await page.waitForURL(/\/designs$/);
    expect(await page.getByTestId('designs-table').textContent()).not.toMatch(/Browser archive rail/);
    await page.getByTestId('designs-view').getByRole('link', { name: 'Archived' }).click();
    await expect.poll(() => page.getByTestId('designs-table').textContent()).toMatch(/Browser archive rail/);
    await page.getByRole('link', { name: 'Browser archive rail' }).click();
    await expect.poll(() => page.getByTestId('archived-banner').textContent()).toMatch(/Archived .*read-only/);
    await screenshot(page, 'design-archived');
    await page.getByRole('button', { name: 'Restore to the list' }).click();
    await expect.poll(() => page.getByTestId('archived-banner').count()).toBe(0);
    await page.goto(`${baseUrl}/designs`);
    expect(await page.getByTestId('designs-table').textContent()).toMatch(/Browser archive rail/);
    await page.context().close();
  });

  it('a reviewer remarks on Compare; the remark lists with the comparison and the author gets it by mail', async () => {
    const designer = await signedInAs(baseUrl, 'designer');
    const saved = await savedDesign(designer, 'Browser compare remark rail');
    expect((await designer.json(`/api/designs/${saved.designId}/revisions`, 'POST', { baseRevision: 1, note: 'r2', input: tweak(saved.input, 'r1', 0.8) })).status).toBe(201);
    const page = await pageAs('reviewer@demo.test');
    await page.goto(`${baseUrl}/designs/${saved.designId}/compare?a=1&b=2`);
    await page.getByLabel('Remark', { exact: true }).fill('From r1 to r2 the crossover rose; check PM at low line.');
    await page.getByRole('button', { name: 'Add remark' }).click();
    await expect.poll(() => page.getByTestId('compare-remark-list').textContent()).toMatch(/on r2 \(comparing with r1\)/);
    await screenshot(page, 'compare-remark');
    const db = openDatabase(dbPath);
    try {
      await expect.poll(() => listMailTo(db, 'designer@demo.test').some((m) => m.subject === 'Remark on Browser compare remark rail r2')).toBe(true);
    } finally {
      db.$client.close();
    }
    await page.context().close();
  });
});
