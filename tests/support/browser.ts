import fs from 'node:fs';
import path from 'node:path';
import type { Browser, BrowserContextOptions, Page } from 'playwright-core';
import { DEMO_PASSWORD } from './http';

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
