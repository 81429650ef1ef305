import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { TEST_OUTPUT_DIR } from '../../scripts/lib/project-paths';

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const SCREENSHOT_DIR = path.join(TEST_OUTPUT_DIR, 'browser');

/** Debian's Chromium, headless, with the background services that would call out to the internet turned off. */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** Every URL the page asked for, to prove that nothing leaves the machine. */
export function recordRequests(page: Page): string[] {
  const urls: string[] = [];
  page.on('request', (request) => urls.push(request.url()));
  return urls;
}

/** Console errors and uncaught exceptions, such as a content-security-policy violation. */
export function recordPageErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(message.text());
  });
  page.on('pageerror', (error) => errors.push(error.message));
  return errors;
}

export async function saveScreenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}

/** Signs in as a user of the demo authority the way a person does: the sign-in page, then the identity provider's page. */
export async function signInThroughProvider(page: Page, appUrl: string, subject: string, path = '/'): Promise<void> {
  await page.goto(`${appUrl}${path}`);
  await page.getByTestId('sign-in').click();
  await page.locator(`button[data-subject="${subject}"]`).click();
  await page.getByTestId('user-name').waitFor();
}
