/**
 * Issue 4 in Chromium: the Tune screen. A designer drags a handle with the
 * mouse, changes a value in the handle table by keyboard, sees the phase
 * margin move, saves with a note and finds the new revision after a reload;
 * a save that races another one offers "save anyway"; leaving with unsaved
 * changes asks first (a link, and the browser's back button). An earlier
 * revision opens read-only until "Edit from rN" loads it as unsaved changes
 * on top of the latest. A viewer sees the plot, cannot edit, and the server
 * answers 403 to a save. Screenshots go to $SCREENSHOT_DIR.
 */
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, chromiumAvailable } from '../support/chromium';
import { screenshot, signedInPage } from '../support/browser';
import { signedInAs, type Client } from '../support/http';
import { savedDesign, tweak, type AnalyzeInput } from '../support/saved-design';

const run = chromiumAvailable();
const baseUrl = inject('baseUrl');
let browser: Browser;
let designer: Client;
let designId: number;
let input: AnalyzeInput;

const pageAs = (email: string): Promise<Page> => signedInPage(browser, baseUrl, email);

async function openTune(page: Page) {
  await page.goto(`${baseUrl}/designs/${designId}`);
  await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
  await page.locator('[data-handle="z0"]').waitFor();
}

const pm = (page: Page) => page.getByTestId('readout-pm').textContent();

async function dragBy(page: Page, handle: string, dx: number, dy: number) {
  // A field lower down may have scrolled the plot away: the mouse only reaches what is in view.
  await page.locator(`[data-handle="${handle}"]`).scrollIntoViewIfNeeded();
  const box = (await page.locator(`[data-handle="${handle}"]`).boundingBox())!;
  const x = box.x + box.width / 2;
  const y = box.y + box.height / 2;
  await page.mouse.move(x, y);
  await page.mouse.down();
  await page.mouse.move(x + dx, y + dy, { steps: 12 });
  await page.mouse.up();
}

describe.runIf(run)('Tune', () => {
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    designer = await signedInAs(baseUrl, 'designer');
    ({ designId, input } = await savedDesign(designer, 'Browser tune rail'));
  });
  afterAll(async () => browser?.close());

  it('lets a designer drag a handle, edit a value by keyboard, save and find the new revision', async () => {
    const page = await pageAs('designer@demo.test');
    await openTune(page);
    const pm0 = await pm(page);
    expect(pm0).toMatch(/°$/);
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('No changes since r1');
    await screenshot(page, 'tune-designer-open');

    // Mouse: drag the first zero a good way to the left.
    const zeroBefore = await page.getByTestId('value-z0').inputValue();
    await dragBy(page, 'z0', -90, 0);
    await expect.poll(() => page.getByTestId('value-z0').inputValue()).not.toBe(zeroBefore);
    const pm1 = await pm(page);
    expect(pm1).not.toBe(pm0);
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('Unsaved changes');
    await screenshot(page, 'tune-designer-dragged');

    // Keyboard: type a new gain into the handle table, then step a handle with the arrow keys.
    await page.getByTestId('value-gain').focus();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('12');
    await page.keyboard.press('Enter');
    await expect.poll(() => page.getByTestId('value-gain').inputValue()).toBe('12.00 dB');
    const pm2 = await pm(page);
    expect(pm2).not.toBe(pm1);
    await page.locator('[data-handle="z0"]').focus();
    await page.keyboard.press('Shift+ArrowRight');
    await expect.poll(() => pm(page)).not.toBe(pm2);
    const pmSaved = await pm(page);
    const gainSaved = await page.getByTestId('value-gain').inputValue();
    await screenshot(page, 'tune-designer-keyboard');

    await page.getByTestId('revision-note').fill('Zero moved down, less mid-band gain');
    await page.getByTestId('save-revision').click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toContain('Saved as r2');
    await screenshot(page, 'tune-designer-saved');

    await page.reload();
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('No changes since r2');
    expect(await page.getByTestId('revision-picker').locator('[aria-current="page"]').textContent()).toBe('r2');
    expect(await pm(page)).toBe(pmSaved);
    expect(await page.getByTestId('value-gain').inputValue()).toBe(gainSaved);
    await expect.poll(() => page.getByTestId('design-name').locator('xpath=..').textContent()).toContain('latest r2');
    await screenshot(page, 'tune-designer-reloaded');

    const revisions = await (await designer.fetch(`/api/designs/${designId}/revisions`)).json();
    const r2 = revisions.revisions.find((r: { number: number }) => r.number === 2);
    expect(r2.note).toBe('Zero moved down, less mid-band gain');
    await page.context().close();
  });

  it('asks before leaving with unsaved changes, and offers "save anyway" after a conflict', async () => {
    const page = await pageAs('designer@demo.test');
    await openTune(page);
    const latest = Number((await page.getByTestId('revision-picker').locator('[aria-current="page"]').textContent())!.slice(1));
    await page.locator('[data-handle="gain"]').focus();
    await page.keyboard.press('ArrowUp');
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('Unsaved changes');

    // Leaving through an in-app link asks first; dismissing keeps the page and the change.
    let asked = '';
    page.once('dialog', (d) => {
      asked = d.message();
      void d.dismiss();
    });
    await page.getByRole('link', { name: 'History' }).click();
    await expect.poll(() => asked).toContain('unsaved changes');
    expect(new URL(page.url()).pathname).toBe(`/designs/${designId}`);

    // Someone else saves meanwhile: the save conflicts, nothing typed is lost, "save anyway" lands on the next number.
    const other = await designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: latest, note: 'from elsewhere', input });
    expect(other.status).toBe(201);
    await page.getByTestId('revision-note').fill('Gain up a notch');
    await page.getByTestId('save-revision').click();
    await page.getByTestId('save-conflict').waitFor();
    expect(await page.getByTestId('save-conflict').textContent()).toContain(`r${latest + 1}`);
    expect(await page.getByTestId('revision-note').inputValue()).toBe('Gain up a notch');
    await screenshot(page, 'tune-designer-conflict');
    await page.getByTestId('save-anyway').click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toContain(`Saved as r${latest + 2}`);
    await page.context().close();
  });

  it('asks before the back button leaves unsaved changes: stay keeps them, leave goes back', async () => {
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs`);
    await openTune(page);
    await page.locator('[data-handle="gain"]').focus();
    await page.keyboard.press('ArrowUp');
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('Unsaved changes');
    const gain = await page.getByTestId('value-gain').inputValue();

    const asked: string[] = [];
    page.once('dialog', (d) => {
      asked.push(d.message());
      void d.dismiss();
    });
    await page.evaluate(() => window.history.back());
    await expect.poll(() => asked.length).toBe(1);
    expect(asked[0]).toContain('unsaved changes');
    expect(new URL(page.url()).pathname).toBe(`/designs/${designId}`);
    expect(await page.getByTestId('save-state').textContent()).toContain('Unsaved changes');
    expect(await page.getByTestId('value-gain').inputValue()).toBe(gain);

    // Asked again on the next press (the guard is back in place); this time leave.
    page.once('dialog', (d) => {
      asked.push(d.message());
      void d.accept();
    });
    await page.evaluate(() => window.history.back());
    await expect.poll(() => asked.length).toBe(2);
    await expect.poll(() => new URL(page.url()).pathname).toBe('/designs');
    await page.context().close();
  });

  it('opens an earlier revision read-only until "Edit from rN" loads it as unsaved changes on top of the latest', async () => {
    const own = await savedDesign(designer, 'Browser edit-from rail');
    const r2Input = tweak(own.input, 'r1', 0.8);
    const r2 = await designer.json(`/api/designs/${own.designId}/revisions`, 'POST', { baseRevision: 1, note: 'smaller R1', input: r2Input });
    expect(r2.status).toBe(201);

    const viewer = await pageAs('viewer@demo.test');
    await viewer.goto(`${baseUrl}/designs/${own.designId}?r=1`);
    await viewer.getByTestId('read-only-note').waitFor();
    expect(await viewer.getByTestId('edit-from').count()).toBe(0);
    await viewer.context().close();

    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${own.designId}?r=1`);
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    await page.getByTestId('read-only-note').waitFor();
    expect(await page.locator('#stage-vin').isDisabled()).toBe(true);
    expect(await page.getByTestId('save-revision').count()).toBe(0);
    const r1Value = await page.getByTestId('value-z0').inputValue();
    await screenshot(page, 'tune-earlier-revision');

    await page.getByTestId('edit-from').click();
    await page.getByTestId('edit-from-note').waitFor();
    expect(new URL(page.url()).searchParams.get('from')).toBe('1');
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('Unsaved changes');
    expect(await page.locator('#stage-vin').isDisabled()).toBe(false);
    expect(await page.getByTestId('value-z0').inputValue()).toBe(r1Value);
    expect(await page.getByTestId('revision-note').inputValue()).toBe('From r1: ');
    expect(await page.getByTestId('save-revision').textContent()).toBe('Save as r3');
    await screenshot(page, 'tune-edit-from-r1');

    await page.getByTestId('revision-note').fill('From r1: back to the first R1');
    await page.getByTestId('save-revision').click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toContain('Saved as r3');
    expect(new URL(page.url()).search).toBe('');
    expect(await page.getByTestId('edit-from-note').count()).toBe(0);

    // r3 was saved on top of r2 (no conflict), with r1's input; r1 and r2 are unchanged.
    const saved = await (await designer.fetch(`/api/designs/${own.designId}/revisions/3`)).json();
    expect(saved.baseNumber).toBe(2);
    expect(saved.note).toBe('From r1: back to the first R1');
    // The stored input carries the operating range's defaults on top of what was sent.
    const first = await (await designer.fetch(`/api/designs/${own.designId}/revisions/1`)).json();
    expect(first.input).toMatchObject(own.input);
    expect(saved.input).toMatchObject(own.input);
    await page.context().close();
  });

  it('reverses drags exactly (+25, −50, +25 px) for the gain and a zero, and undoes/redoes each edit (keys and buttons)', async () => {
    const own = await savedDesign(designer, 'Browser reversible rail');
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${own.designId}`);
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    const gain0 = await page.getByTestId('value-gain').inputValue();
    const zero0 = await page.getByTestId('value-z0').inputValue();
    const integrator0 = await page.getByTestId('value-integrator').inputValue();
    // The gain handle says what it is: the compensator's gain at its own frequency, and that it sets the integrator.
    expect(await page.locator('[data-handle="gain"]').getAttribute('aria-valuetext')).toMatch(/dB, sets the integrator$/);
    expect(await page.locator('[data-row="gain"]').textContent()).toMatch(/Gain at .*Hz/);

    for (const step of [25, -50, 25]) {
      await dragBy(page, 'gain', 0, step);
      await page.waitForTimeout(300);
    }
    expect(await page.getByTestId('value-gain').inputValue()).toBe(gain0);
    expect(await page.getByTestId('value-integrator').inputValue()).toBe(integrator0);
    for (const step of [25, -50, 25]) {
      await dragBy(page, 'z0', step, 0);
      await page.waitForTimeout(300);
    }
    expect(await page.getByTestId('value-z0').inputValue()).toBe(zero0);
    // Moving a zero holds the integrator (the curve below it stays).
    expect(await page.getByTestId('value-integrator').inputValue()).toBe(integrator0);
    // Back where it started: nothing to save.
    await expect.poll(() => page.getByTestId('save-state').textContent()).toContain('No changes since r1');

    // Undo: each drag is one step, the last first.
    await dragBy(page, 'z0', -60, 0);
    const zeroMoved = await page.getByTestId('value-z0').inputValue();
    expect(zeroMoved).not.toBe(zero0);
    await page.locator('[data-handle="z0"]').focus();
    await page.keyboard.press('ControlOrMeta+Z');
    await expect.poll(() => page.getByTestId('value-z0').inputValue()).toBe(zero0);
    await page.keyboard.press('ControlOrMeta+Shift+Z');
    await expect.poll(() => page.getByTestId('value-z0').inputValue()).toBe(zeroMoved);
    await page.getByTestId('undo').click();
    await expect.poll(() => page.getByTestId('value-z0').inputValue()).toBe(zero0);
    await page.getByTestId('redo').click();
    await expect.poll(() => page.getByTestId('value-z0').inputValue()).toBe(zeroMoved);
    // A stage edit is undone too (the field shows the value again).
    const vin = await page.locator('#stage-vin').inputValue();
    await page.locator('#stage-vin').fill(String(Number(vin) + 1));
    await expect.poll(() => page.getByTestId('undo').isEnabled()).toBe(true);
    await page.getByTestId('undo').click();
    await expect.poll(() => page.locator('#stage-vin').inputValue()).toBe(vin);
    await screenshot(page, 'tune-undo');
    await page.context().close();
  }, 300_000); // six drags, four undo steps: slow on a loaded 2-core machine

  it('takes typed part values (SI prefixes) and holds a locked part while the handles move the others', async () => {
    const own = await savedDesign(designer, 'Browser parts rail');
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${own.designId}`);
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    const zero0 = await page.getByTestId('value-z0').inputValue();
    const c1 = page.getByTestId('part-c1-value');
    await c1.focus();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('4.7n');
    await page.keyboard.press('Enter');
    await expect.poll(() => c1.inputValue()).toBe('4.7 nF');
    await expect.poll(() => page.getByTestId('value-z0').inputValue()).not.toBe(zero0);

    await page.getByTestId('part-c1-lock').check();
    const r1Before = await page.getByTestId('part-r1-value').inputValue();
    await dragBy(page, 'z0', 40, 0);
    await dragBy(page, 'gain', 0, -20);
    await page.waitForTimeout(300);
    expect(await c1.inputValue()).toBe('4.7 nF');
    expect(await page.getByTestId('part-r1-value').inputValue()).not.toBe(r1Before);
    await screenshot(page, 'tune-parts-locked');
    await page.context().close();
  });

  it('follows the stage with the target fc, keeps fc and the PM target on a type change, and explains a fallback', async () => {
    const own = await savedDesign(designer, 'Browser starting point rail');
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${own.designId}`);
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    await page.locator('summary', { hasText: 'Starting point' }).click();
    const fcBefore = await page.locator('#sp-fc').inputValue();
    const fsw = await page.locator('#stage-fsw').inputValue();
    await page.locator('#stage-fsw').fill('800k');
    await expect.poll(() => page.locator('#sp-fc').inputValue()).not.toBe(fcBefore);
    await page.locator('#stage-fsw').fill(fsw);
    await expect.poll(() => page.locator('#sp-fc').inputValue()).toBe(fcBefore);

    const fc0 = await page.getByTestId('readout-fc').textContent();
    const other = (await page.getByTestId('compensator-type').inputValue()) === 'type3' ? 'type2' : 'type3';
    await page.getByTestId('compensator-type').selectOption(other);
    await page.getByTestId('type-note').waitFor();
    const note = (await page.getByTestId('type-note').textContent())!;
    if (/same fc/.test(note)) expect(await page.getByTestId('readout-fc').textContent()).toBe(fc0);
    else expect(note).toMatch(/Reachable with Type I/);
    await page.getByTestId('compensator-type').selectOption('type1');
    await expect.poll(() => page.getByTestId('type-note').textContent()).toMatch(/Type I adds no phase boost.*Placed/);
    await screenshot(page, 'tune-type1-note');
    await page.context().close();
  });

  it('keeps a sweep set on Tune with the revision, and says when the crossover lies above it', async () => {
    const own = await savedDesign(designer, 'Browser sweep rail');
    const page = await pageAs('designer@demo.test');
    await page.goto(`${baseUrl}/designs/${own.designId}`);
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    const stop = page.getByTestId('sweep-stop');
    await stop.focus();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('1k');
    await page.keyboard.press('Enter');
    await expect.poll(() => stop.inputValue()).toBe('1 kHz');
    // The loop is still above 0 dB at 1 kHz: the check says so instead of "no crossover".
    await expect.poll(() => page.getByTestId('tune').textContent()).toMatch(/crossover lies above the end of the sweep/);
    expect(await page.getByTestId('readout-fc').textContent()).not.toMatch(/no crossover/);
    expect(await page.getByTestId('readout-fc').textContent()).toBe('> 1 kHz');
    await page.getByTestId('revision-note').fill('Sweep to 1 kHz');
    await page.getByTestId('save-revision').click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toContain('Saved as r2');
    const saved = await (await designer.fetch(`/api/designs/${own.designId}/revisions/2`)).json();
    expect(saved.input.sweep).toEqual({ fStart: 10, fStop: 1000, points: 400 });
    await page.reload();
    await page.locator('[data-plot-ready="true"]').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('sweep-stop').inputValue()).toBe('1 kHz');
    await page.context().close();
  });

  it('lets a viewer try a what-if in Scratch: margins move, nothing is saved, and it is clearly marked', async () => {
    const page = await pageAs('viewer@demo.test');
    await openTune(page);
    const pm0 = await pm(page);
    await page.getByTestId('scratch-start').click();
    await page.getByTestId('scratch-banner').waitFor();
    expect(await page.getByTestId('tune').getAttribute('data-scratch')).toBe('true');
    expect(await page.getByTestId('save-revision').count()).toBe(0);
    await dragBy(page, 'z0', -90, 0);
    await expect.poll(() => pm(page)).not.toBe(pm0);
    await screenshot(page, 'tune-scratch');
    await page.getByTestId('scratch-leave').click();
    await expect.poll(() => pm(page)).toBe(pm0);
    expect(await page.getByTestId('scratch-banner').count()).toBe(0);
    await page.context().close();
  });

  it('shows a viewer the plot but no way to edit, and the server refuses a save', async () => {
    const page = await pageAs('viewer@demo.test');
    await openTune(page);
    await page.getByTestId('read-only-note').waitFor();
    expect(await page.getByTestId('save-revision').count()).toBe(0);
    expect(await page.locator('#stage-vin').isDisabled()).toBe(true);
    expect(await page.getByTestId('value-z0').isDisabled()).toBe(true);
    expect(await page.locator('[data-handle="z0"]').getAttribute('aria-disabled')).toBe('true');

    const pmBefore = await pm(page);
    await dragBy(page, 'z0', -90, 0);
    await page.locator('[data-handle="gain"]').focus();
    await page.keyboard.press('ArrowUp');
    expect(await pm(page)).toBe(pmBefore);
    await screenshot(page, 'tune-viewer');

    const status = await page.evaluate(
      async ([id, body]) => {
        const res = await fetch(`/api/designs/${id}/revisions`, { method: 'POST', headers: { 'content-type': 'application/json' }, body });
        return res.status;
      },
      [designId, JSON.stringify({ baseRevision: null, note: 'viewer try', input })] as const,
    );
    expect(status).toBe(403);
    await page.context().close();
  });
});
