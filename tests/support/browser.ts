import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
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
