/**
 * Issue 5 in Chromium: a designer picks two revisions on History and
 * compares them (both loops on one plot, changed cells marked); then a full
 * sign-off — the designer submits, the reviewer follows the mail's link and
 * approves with a remark, the designer gets the mail; an admin adds a member
 * and reads the welcome mail in the demo mailbox.
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
let designId: number;

function mailTo(address: string) {
  const db = openDatabase(dbPath);
  try {
    return listMailTo(db, address);
  } finally {
    db.$client.close();
  }
}

const pageAs = (email: string): Promise<Page> => signedInPage(browser, baseUrl, email, { viewport: { width: 1400, height: 1000 } });

describe.runIf(run)('Compare and Sign-off', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const designer = await signedInAs(baseUrl, 'designer');
    const saved = await savedDesign(designer, 'Browser review rail');
    designId = saved.designId;
    const r2 = await designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: 1, note: 'Lower R1 for more gain', input: tweak(saved.input, 'r1', 0.7) });
    expect(r2.status).toBe(201);
  });
  afterAll(async () => browser?.close());

  it('picks two revisions on History and shows both loops and what changed', async () => {
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${designId}/history`);
    await page.getByLabel('Pick r1 to compare').check();
    await page.getByLabel('Pick r2 to compare').check();
    await page.getByTestId('compare-picked').click();
    await page.waitForURL(/\/compare\?a=1&b=2/);

    // both loops drawn on one plot: two magnitude and two phase curves, one dashed
    const plot = page.getByTestId('bode-plot');
    await expect.poll(() => plot.locator('.scatterlayer .trace').count(), { timeout: 30_000 }).toBeGreaterThan(4);
    const dashes = await plot.locator('.scatterlayer .trace path.js-line').evaluateAll((paths) => paths.map((p) => (p as SVGPathElement).style.strokeDasharray || 'solid'));
    expect(dashes.some((d) => d !== 'solid')).toBe(true);

    const table = page.getByTestId('diff-table');
    const r1Row = table.locator('tr[data-key="comp.r1"]');
    expect(await r1Row.getAttribute('data-changed')).toBe('true');
    expect(await r1Row.textContent()).toMatch(/−30\.0 %/);
    expect(await table.locator('tr[data-key="vin"]').getAttribute('data-changed')).toBe('false');
    expect(await page.getByTestId('margin-deltas').textContent()).toMatch(/Phase margin/);
    await screenshot(page, 'compare-r1-r2');

    const all = await table.locator('tr[data-key]').count();
    await page.getByLabel('Only what changed').check();
    await expect.poll(() => table.locator('tr[data-key]').count()).toBeLessThan(all);
    expect(await table.locator('tr[data-changed="false"]').count()).toBe(0);
    await page.context().close();
  });

  it('designer submits, reviewer approves from the mail link, designer is told', async () => {
    const designer = await pageAs('designer@demo.test');
    await designer.goto(`${baseUrl}/designs/${designId}/history?r=2`);
    const panel = designer.getByTestId('signoff-panel');
    await designer.getByLabel('Reviewer', { exact: true }).selectOption({ label: 'Rui Reviewer (reviewer)' });
    await designer.getByLabel('Message to the reviewer').fill('Gain raised by lowering R1; please check PM');
    await designer.getByRole('button', { name: 'Submit r2 for review' }).click();
    await expect.poll(() => panel.locator('[data-state]').first().getAttribute('data-state')).toBe('in-review');
    // The author's side says whom it waits for (it used to be an empty half).
    await expect.poll(() => panel.getByTestId('waiting-for').textContent()).toBe('Waiting for Rui Reviewer to approve r2 or request changes.');
    await screenshot(designer, 'history-submitted');

    const request = mailTo('reviewer@demo.test').find((m) => m.text.includes('Gain raised by lowering R1'));
    expect(request?.subject).toBe('Review requested: Browser review rail r2');
    const link = /https?:\/\/\S+\/designs\/\d+\/history\?r=2/.exec(request!.text)?.[0];
    expect(link).toBeTruthy();

    const reviewer = await pageAs('reviewer@demo.test');
    await reviewer.goto(link!.replace(/^https?:\/\/[^/]+/, baseUrl));
    const rpanel = reviewer.getByTestId('signoff-panel');
    expect(await rpanel.textContent()).toMatch(/Gain raised by lowering R1/);
    await reviewer.getByRole('textbox', { name: 'Add a remark' }).fill('Checked the step response margin; fine at low line.');
    await reviewer.getByRole('button', { name: 'Add remark' }).click();
    await expect.poll(() => reviewer.getByTestId('timeline').textContent()).toMatch(/fine at low line/);
    await reviewer.getByLabel(/Remarks with the decision/).fill('Approved for the pilot build');
    await reviewer.getByRole('button', { name: 'Approve r2' }).click();
    await expect.poll(() => rpanel.locator('[data-state]').first().getAttribute('data-state')).toBe('approved');
    expect(await reviewer.getByTestId('revisions-table').locator('tr[data-revision="2"] [data-state]').getAttribute('data-state')).toBe('approved');
    await screenshot(reviewer, 'history-approved');

    const approved = mailTo('designer@demo.test').find((m) => m.subject === 'Approved: Browser review rail r2');
    expect(approved?.text).toContain('Approved for the pilot build');

    await designer.goto(`${baseUrl}/designs`);
    const row = designer.getByTestId('designs-table').locator('tr', { hasText: 'Browser review rail' });
    expect(await row.locator('[data-state]').getAttribute('data-state')).toBe('approved');
    await designer.context().close();
    await reviewer.context().close();
  });

  it('a viewer reads the sign-off but gets no forms', async () => {
    const viewer = await pageAs('viewer@demo.test');
    await viewer.goto(`${baseUrl}/designs/${designId}/history?r=1`);
    const panel = viewer.getByTestId('signoff-panel');
    await panel.waitFor();
    expect(await panel.locator('form').count()).toBe(0);
    await viewer.context().close();
  });

  it('an admin invites a member; the mail carries the link to accept', async () => {
    const admin = await pageAs('admin@demo.test');
    await admin.goto(`${baseUrl}/admin`);
    await admin.getByLabel('Email').fill('nia@demo.test');
    await admin.locator('#member-role').selectOption('reviewer');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => admin.getByRole('status').textContent()).toMatch(/Invitation sent to nia@demo.test/);
    const mail = mailTo('nia@demo.test')[0];
    expect(mail?.subject).toMatch(/^Invitation to .+ on Phasewright$/);
    const link = mail?.text.match(/https?:\/\/\S+invitations\/accept\?token=\S+/)?.[0] ?? '';
    const nia = await (await admin.context().browser()!.newContext()).newPage();
    await nia.goto(link.replace(/^https?:\/\/[^/]+/, baseUrl));
    await nia.getByLabel('Your name').fill('Nia Newcomer');
    await nia.getByLabel(/Choose a password/).fill('a long enough password');
    await nia.getByRole('button', { name: 'Accept and join' }).click();
    await nia.waitForURL(/\/signin/);
    await screenshot(admin, 'admin-invited');
    await admin.context().close();
  });

  it('the mailbox shows the signed-in member their own mail only', async () => {
    const reviewer = await pageAs('reviewer@demo.test');
    await reviewer.goto(`${baseUrl}/mailbox`);
    const text = (await reviewer.locator('main').textContent()) ?? '';
    expect(text).toContain('reviewer@demo.test');
    expect(text).not.toContain('to nia@demo.test');
    await screenshot(reviewer, 'mailbox');
    await reviewer.context().close();
  });
});
