import fs from 'node:fs';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

/**
 * Whether Chromium can be used. Missing on a developer's machine: the tests
 * say they were skipped. Missing under CI=true: that is a failure.
 */
export function chromiumAvailable(): boolean {
  if (fs.existsSync(CHROMIUM)) return true;
  if (process.env.CI === 'true') throw new Error(`Chromium is required in CI but ${CHROMIUM} is missing (apt-get install chromium)`);
  console.warn(`[skipped] browser tests: ${CHROMIUM} not found (apt-get install chromium)`);
  return false;
}
