/** Issue 2: a person signs in through the form and sees the team's designs. */
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signInThroughForm } from '../support/browser';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;

describe.runIf(run)('sign-in and designs list', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  });
  afterAll(async () => browser?.close());

  it('shows the sign-in page to a visitor, then the designs table to the designer', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    await page.goto(`${baseUrl}/designs`);
    await page.waitForURL(/\/signin/);
    await signInThroughForm(page, baseUrl, 'designer@demo.test');
    await page.waitForURL(/\/designs/);
    const table = page.getByTestId('designs-table');
    await expect.poll(() => table.locator('tbody tr').count()).toBeGreaterThanOrEqual(3);
    expect(await table.textContent()).toMatch(/buck-boost/i);
    expect(await page.getByTestId('role-badge').textContent()).toBe('designer');
    await screenshot(page, 'designs-list');

    // Other browser tests add designs to the same team: the filter narrows whatever is there.
    const all = await table.locator('tbody tr').count();
    await page.getByLabel('Filter designs').fill('inverting');
    await expect.poll(() => table.locator('tbody tr').count()).toBeLessThan(all);
    expect(await table.textContent()).toMatch(/−12 V bias/);
    await page.close();
  });

  it('tells a visitor when the password is wrong', async () => {
    const page = await browser.newPage();
    await page.goto(`${baseUrl}/signin`);
    await page.getByLabel('Email').fill('viewer@demo.test');
    await page.getByLabel('Password').fill('wrong password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByTestId('signin-error').textContent()).toMatch(/do not match/);
    await page.close();
  });
});
