/**
 * Control modes on Tune in Chromium: a designer turns a voltage-mode boost of our own into a
 * peak current-mode boost with a transconductance amplifier (the modulator and amplifier
 * choices, their fields), sees the current-mode double pole at fsw/2 labelled, tunes it by
 * dragging, saves, compares and exports the netlist; at light load the same boost runs in
 * DCM and the plot marks the DCM pole. Screenshots go to $SCREENSHOT_DIR.
 */
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signedInPage } from '../support/browser';
import { signedInAs, type Client } from '../support/http';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;
let designer: Client;
let designId: number;

/** A 5 → 12 V / 1 A boost at 400 kHz, voltage mode, Type II around an op-amp (our own). */
const boost = {
  converter: { topology: 'boost', vin: 5, vout: 12, iout: 1, fsw: 400e3, l: 6.8e-6, rl: 0.025, c: 44e-6, rc: 0.004, vd: 0.35 },
  modulator: { vramp: 1 },
  feedback: { vref: 1.2 },
  compensator: { type: 'type2', r1: 100e3, r2: 20e3, c1: 22e-9, c2: 470e-12 },
};

const pageAs = (email: string): Promise<Page> => signedInPage(browser, baseUrl, email);

async function openTune(page: Page) {
  await page.goto(`${baseUrl}/designs/${designId}`);
  await page.locator('[data-plot-ready="true"]').first().waitFor({ timeout: 60_000 });
  await page.locator('[data-handle="z0"]').waitFor();
}

async function retype(page: Page, label: RegExp | string, text: string) {
  const field = typeof label === 'string' ? page.locator(label) : page.getByLabel(label);
  await field.fill(text);
  await field.press('Tab');
}

describe.runIf(run)('Tune: control modes and amplifiers', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    designer = await signedInAs(baseUrl, 'designer');
    const created = await designer.json('/api/designs', 'POST', { name: 'Browser current-mode rail', topology: 'boost' });
    designId = (await created.json()).id;
    const saved = await designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: null, note: 'voltage mode', input: boost });
    expect(saved.status).toBe(201);
  });
  afterAll(async () => browser?.close());

  it('switches to peak current mode with a gm amplifier, labels the fsw/2 pole, drags, saves, compares and exports', async () => {
    const page = await pageAs('designer@demo.test');
    await openTune(page);
    expect(await page.locator('body').textContent()).not.toMatch(/Current-mode double pole/);

    await page.getByTestId('modulator-mode').selectOption('peak-current');
    await retype(page, /Current-sense gain/, '0.1');
    await retype(page, /External ramp/, '82k');
    await page.getByTestId('amplifier').selectOption('transconductance');
    await retype(page, /Transconductance gm/, '1m');
    await retype(page, /Divider bottom Rb/, '11k');
    await expect.poll(() => page.locator('body').textContent(), { timeout: 20_000 }).toMatch(/Current-mode double pole fsw\/2/);
    await expect.poll(() => page.getByTestId('readout-pm').textContent()).toMatch(/°$/);
    await screenshot(page, 'modes-current-gm');

    const pmBefore = await page.getByTestId('readout-pm').textContent();
    const handle = page.locator('[data-handle="z0"]');
    await handle.scrollIntoViewIfNeeded();
    const box = (await handle.boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width / 2 - 60, box.y + box.height / 2, { steps: 10 });
    await page.mouse.up();
    await expect.poll(() => page.getByTestId('readout-pm').textContent()).not.toBe(pmBefore);

    await page.getByTestId('revision-note').fill('Peak current mode, gm amplifier');
    await page.getByTestId('save-revision').click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toContain('Saved as r2');

    const r2 = await (await designer.fetch(`/api/designs/${designId}/revisions/2`)).json();
    expect(r2.input.modulator).toMatchObject({ mode: 'peak-current', ri: 0.1, se: 82e3 });
    expect(r2.input.compensator).toMatchObject({ amplifier: 'transconductance', gm: 1e-3, rb: 11e3 });

    await page.goto(`${baseUrl}/designs/${designId}/compare?a=1&b=2`);
    await expect.poll(() => page.locator('main').textContent(), { timeout: 20_000 }).toMatch(/Peak current mode/);
    expect(await page.locator('main').textContent()).toMatch(/Transconductance \(gm\)/);
    await screenshot(page, 'modes-compare');

    const netlist = await (await designer.fetch(`/api/designs/${designId}/revisions/2/export?format=spice`)).text();
    expect(netlist).toMatch(/transconductance amplifier/);
    expect(netlist).toMatch(/sampling gain He\(s\)/);
    await page.context().close();
  });

  it('marks the DCM pole when the load drops below the boundary, and says the DCM model is in use', async () => {
    const page = await pageAs('designer@demo.test');
    await openTune(page);
    await page.getByTestId('modulator-mode').selectOption('voltage');
    await retype(page, '#stage-iout', '20m');
    await expect.poll(() => page.locator('body').textContent(), { timeout: 20_000 }).toMatch(/DCM pole/);
    await expect.poll(() => page.locator('body').textContent()).toMatch(/discontinuous/i);
    await screenshot(page, 'modes-dcm');
    await page.context().close();
  });
});
