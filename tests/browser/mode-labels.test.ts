/**
 * Tune names what it draws after the control mode and the amplifier: the power-stage trace is
 * Gvc in peak current mode and says "DCM model" at light load (Ridley 1991; Erickson &
 * Maksimović 2nd ed. ch. 15), and around a transconductance amplifier the handle table shows
 * the gm formulas (gm·Rb/((R1+Rb)·(C1+C2)), the divider-loaded feed-forward pole). Screenshots go
 * to $SCREENSHOT_DIR.
 */
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signedInPage } from '../support/browser';
import { signedInAs, type Client } from '../support/http';
import { demoInput } from '../support/saved-design';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;
let designer: Client;

/** A design of this test's own with r1 saved from the demo input with these changes. */
async function designWith(name: string, change: Record<string, unknown>) {
  const input = { ...(await demoInput(designer)), ...change };
  const topology = (input.converter as { topology: string }).topology;
  const created = await designer.json('/api/designs', 'POST', { name, topology });
  const design = await created.json();
  const saved = await designer.json(`/api/designs/${design.id}/revisions`, 'POST', { baseRevision: null, note: 'first', input });
  if (saved.status !== 201) throw new Error(`could not save: ${saved.status} ${await saved.text()}`);
  return design.id as number;
}

const boost = { topology: 'boost', vin: 5, vout: 12, iout: 0.5, fsw: 400e3, l: 10e-6, rl: 0.03, c: 44e-6, rc: 0.005, vd: 0.4 };

describe.runIf(run)('Tune labels per control mode and amplifier', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    designer = await signedInAs(baseUrl, 'designer');
  });
  afterAll(async () => browser?.close());

  it('current mode with a gm amplifier: Gvc in the legend, gm formulas in the handle table', async () => {
    const id = await designWith('Browser gm current-mode boost', {
      converter: boost,
      modulator: { mode: 'peak-current', ri: 0.1, se: 3e4 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', amplifier: 'transconductance', gm: 1e-3, ro: 2e6, rb: 4.42e3, r1: 40.2e3, r2: 10e3, c1: 10e-9, c2: 100e-12 },
    });
    const page = await signedInPage(browser, baseUrl, 'designer@demo.test');
    await page.goto(`${baseUrl}/designs/${id}`);
    await page.getByTestId('legend-plant').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('legend-plant').textContent()).toMatch(/Gvc \(current mode\)/);
    const table = page.getByTestId('handle-table');
    expect(await page.getByTestId('integrator-formula').textContent()).toContain('gm·Rb/(2π·(R1+Rb)·(C1+C2))');
    expect(await table.locator('[data-row="gain"]').textContent()).toContain('gm·Rb/((R1+Rb)·(C1+C2))');
    expect(await table.textContent()).not.toContain('1/(2π·R1·(C1+C2))');
    await screenshot(page, 'tune-gm-current-mode');
  });

  it('light load: the DCM model is named', async () => {
    const id = await designWith('Browser DCM boost', {
      converter: { ...boost, iout: 0.02, rl: 0 },
      modulator: { mode: 'voltage', vramp: 1 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', r1: 10e3, r2: 20e3, c1: 4.7e-9, c2: 47e-12 },
    });
    const page = await signedInPage(browser, baseUrl, 'designer@demo.test');
    await page.goto(`${baseUrl}/designs/${id}`);
    await page.getByTestId('legend-plant').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('legend-plant').textContent()).toBe('Power stage Gvd/Vramp (DCM model)');
    expect(await page.getByTestId('integrator-formula').textContent()).toContain('1/(2π·R1·(C1+C2))');
  });
});
