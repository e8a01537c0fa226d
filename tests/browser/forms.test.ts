/**
 * Every form shows its errors beside the field: the shared zod schema's messages before a
 * request, and the server's issues (policy, wrong password) after one. Screenshots of each
 * form with an error shown.
 */
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signedInPage } from '../support/browser';
import { signedInAs } from '../support/http';
import { savedDesign } from '../support/saved-design';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;
let designId: number;

const pageAs = (email: string): Promise<Page> => signedInPage(browser, baseUrl, email, { viewport: { width: 1400, height: 1000 } });
const textOf = (page: Page, id: string) => page.locator(`#${id}-error`).textContent();

describe.runIf(run)('forms: errors beside the field', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const designer = await signedInAs(baseUrl, 'designer');
    designId = (await savedDesign(designer, 'Browser forms rail')).designId;
  });
  afterAll(async () => browser?.close());

  it('sign-in: a malformed address is named beside Email before any request', async () => {
    const page = await browser.newPage({ viewport: { width: 1200, height: 800 } });
    await page.goto(`${baseUrl}/signin`, { waitUntil: 'networkidle' });
    await page.getByLabel('Email').fill('not-an-address');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => textOf(page, 'email')).toMatch(/valid|email/i);
    expect(await textOf(page, 'password')).toMatch(/enter your password/);
    await screenshot(page, 'forms-signin-errors');
    await page.close();
  });

  it('sign-off: submit, then "Request changes" without remarks is refused beside the remarks (the policy rule)', async () => {
    const designer = await pageAs('designer@demo.test');
    await designer.goto(`${baseUrl}/designs/${designId}/history?r=1`);
    await designer.getByLabel('Reviewer', { exact: true }).selectOption({ label: 'Rui Reviewer (reviewer)' });
    await designer.getByRole('button', { name: 'Submit r1 for review' }).click();
    const panel = designer.getByTestId('signoff-panel');
    await expect.poll(() => panel.locator('[data-state]').first().getAttribute('data-state')).toBe('in-review');
    await screenshot(designer, 'forms-signoff-submitted');
    await designer.context().close();

    const reviewer = await pageAs('reviewer@demo.test');
    await reviewer.goto(`${baseUrl}/designs/${designId}/history?r=1`);
    await reviewer.getByRole('button', { name: 'Request changes' }).click();
    await expect.poll(() => textOf(reviewer, 'decision-message')).toMatch(/Say what should change/);
    expect(await reviewer.locator('#decision-message').getAttribute('class')).toMatch(/input-error/);
    await screenshot(reviewer, 'forms-signoff-decision-error');
    await reviewer.context().close();
  });

  it('designators: a value that is no reference designator is named beside its part; nothing is saved', async () => {
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${designId}/handoff`);
    const editor = page.getByTestId('designator-editor');
    await editor.locator('#designator-r1').fill('12-R');
    await editor.getByRole('button', { name: 'Save designators' }).click();
    await expect.poll(() => textOf(page, 'designator-r1')).toMatch(/reference designator such as R17/);
    await editor.locator('#designator-r1').fill('R17');
    await editor.getByRole('button', { name: 'Save designators' }).click();
    await expect.poll(() => editor.getByRole('status').textContent()).toMatch(/Saved/);
    await screenshot(page, 'forms-designators');
    await page.context().close();
  });

  it('team admin: an invitation to a malformed address is named beside Email', async () => {
    const admin = await pageAs('admin@demo.test');
    await admin.goto(`${baseUrl}/admin`);
    await admin.locator('#member-email').fill('nobody-at-all');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => textOf(admin, 'member-email')).toMatch(/valid email/);
    await screenshot(admin, 'forms-team-admin');
    await admin.context().close();
  });

  it('account: a short new password is refused beside it; a wrong current one by the server, beside that field', async () => {
    const page = await pageAs('viewer@demo.test');
    await page.goto(`${baseUrl}/settings`);
    await page.locator('#current-password').fill('not my password');
    await page.locator('#new-password').fill('short');
    await page.getByRole('button', { name: 'Change password' }).click();
    await expect.poll(() => textOf(page, 'new-password')).toMatch(/at least 8 characters/);
    await page.locator('#new-password').fill('a long enough new password');
    await page.getByRole('button', { name: 'Change password' }).click();
    await expect.poll(() => textOf(page, 'current-password')).toMatch(/not right/);
    expect(page.url()).toMatch(/\/settings/);
    await screenshot(page, 'forms-account');
    await page.context().close();
  });
});
