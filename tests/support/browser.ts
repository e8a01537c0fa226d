import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContextOptions, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS } from './chromium';
import { DEMO_PASSWORD, signedInAs, type Client } from './http';
import { savedDesign } from './saved-design';

/** Screenshots for people to look at: $SCREENSHOT_DIR or /tmp/phasewright-shots. */
export const SHOT_DIR = process.env.SCREENSHOT_DIR ?? '/tmp/phasewright-shots';

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(SHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SHOT_DIR, `${name}.png`), fullPage: true });
}

export async function signInThroughForm(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  if (!page.url().includes('/signin')) await page.goto(`${baseUrl}/signin`);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
}

/**
 * A fresh browser context signed in as `email` through the form. The sign-in page is let to
 * hydrate first (network idle), so the click signs in rather than submitting the bare form.
 * `acceptDialogs` accepts every confirmation (for tests that do not look at them).
 */
export async function signedInPage(
  browser: Browser,
  baseUrl: string,
  email: string,
  { acceptDialogs = false, ...options }: BrowserContextOptions & { acceptDialogs?: boolean } = {},
): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1500, height: 1100 }, ...options });
  const page = await context.newPage();
  if (acceptDialogs) page.on('dialog', (d) => d.accept());
  await page.goto(`${baseUrl}/signin`, { waitUntil: 'networkidle' });
  await signInThroughForm(page, baseUrl, email);
  return page;
}

/**
 * A suite's Chromium and a design saved by the designer through the API, set up in beforeAll
 * and closed in afterAll (call inside describe). Fields are filled when the suite's tests run.
 */
export function browserWithSavedDesign(baseUrl: string, designName: string) {
  let browser: Browser | undefined;
  let designer: Client | undefined;
  let designId = 0;
  const ready = <T>(v: T | undefined): T => {
    if (v === undefined) throw new Error('browserWithSavedDesign: read before beforeAll ran');
    return v;
  };
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    designer = await signedInAs(baseUrl, 'designer');
    designId = (await savedDesign(designer, designName)).designId;
  });
  afterAll(async () => browser?.close());
  return {
    get designer() {
      return ready(designer);
    },
    get designId() {
      return designId;
    },
    /** A fresh context signed in through the form as `email`. */
    pageAs: (email: string): Promise<Page> => signedInPage(ready(browser), baseUrl, email),
  };
}
