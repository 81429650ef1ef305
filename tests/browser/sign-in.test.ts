import type { Browser, Page } from 'playwright-core';
import { APP_URL_VARIABLE } from '../support/browser-global-setup';
import { launchBrowser, recordPageErrors, recordRequests, saveScreenshot, signInThroughProvider } from '../support/browser';

const appUrl = () => {
  const url = process.env[APP_URL_VARIABLE];
  if (!url) throw new Error(`${APP_URL_VARIABLE} is not set: run this suite through jest's browser project`);
  return url;
};

describe('signing in through the organisation identity provider', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser.close());

  async function newPage(): Promise<{ page: Page; requests: string[]; errors: string[] }> {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    return { page, requests: recordRequests(page), errors: recordPageErrors(page) };
  }

  it('shows a visitor a sign-in page instead of the map', async () => {
    const { page, errors } = await newPage();
    await page.goto(appUrl());
    await page.getByRole('heading', { name: 'Sign in to Spanledger' }).waitFor();
    expect(await page.getByTestId('network-map').count()).toBe(0);
    await saveScreenshot(page, 'sign-in-page');
    expect(errors).toEqual([]);
    await page.close();
  });

  it.each([
    ['bv-staff-1041', 'Dana Whitcombe', 'Inspector · North District'],
    ['bv-staff-2029', 'Tomasz Brenek', 'Rating engineer · East District, South District'],
    ['bv-staff-3002', 'Greer Ashdown', 'Asset manager (administrator) · Whole network'],
  ])('signs in %s and shows their name, role and districts, with nothing leaving 127.0.0.1', async (subject, name, roleLine) => {
    const { page, requests, errors } = await newPage();
    await signInThroughProvider(page, appUrl(), subject);
    expect(await page.getByTestId('user-name').textContent()).toBe(name);
    expect((await page.getByTestId('user-role').textContent())?.trim()).toBe(roleLine);
    await page.getByTestId('network-map').waitFor();
    await saveScreenshot(page, `signed-in-${subject}`);
    const hosts = new Set(requests.filter((url) => /^https?:/.test(url)).map((url) => new URL(url).hostname));
    expect([...hosts]).toEqual(['127.0.0.1']);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('comes back to the page asked for after sign-in and marks the role in the matrix', async () => {
    const { page, errors } = await newPage();
    await signInThroughProvider(page, appUrl(), 'bv-staff-2013', '/my-role');
    await page.getByRole('heading', { name: 'What my role can do' }).waitFor();
    expect((await page.locator('th[data-mine]').textContent())?.trim()).toBe('Rating engineer (you)');
    expect(await page.locator('tr.allowed').count()).toBe(6);
    await saveScreenshot(page, 'my-role-rater');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('opens the network register to a manager and refuses it to an inspector', async () => {
    const manager = await newPage();
    await signInThroughProvider(manager.page, appUrl(), 'bv-staff-3018');
    await manager.page.getByTestId('nav-register').click();
    await manager.page.getByTestId('register-row').first().waitFor();
    expect(await manager.page.getByTestId('register-row').count()).toBeGreaterThanOrEqual(40);
    const download = manager.page.waitForEvent('download');
    await manager.page.getByTestId('register-export').click();
    expect((await download).suggestedFilename()).toMatch(/^network-register-\d{4}-\d{2}-\d{2}\.csv$/);
    await saveScreenshot(manager.page, 'network-register-manager');
    expect(manager.errors).toEqual([]);
    await manager.page.close();

    const inspector = await newPage();
    await signInThroughProvider(inspector.page, appUrl(), 'bv-staff-1057');
    expect(await inspector.page.getByTestId('nav-register').count()).toBe(0);
    await inspector.page.goto(`${appUrl()}/register`);
    await inspector.page.getByTestId('not-allowed').waitFor();
    const direct = await inspector.page.request.get(`${appUrl()}/api/network-register.csv`);
    expect(direct.status()).toBe(403);
    await saveScreenshot(inspector.page, 'network-register-refused');
    expect(inspector.errors).toEqual([]);
    await inspector.page.close();
  });

  it('signs out, after which the map asks for sign-in again', async () => {
    const { page, errors } = await newPage();
    await signInThroughProvider(page, appUrl(), 'bv-staff-1041');
    // Sign out from the map as a person would, once it has shown the network (not while its first answers are on their way).
    await page.getByTestId('structure-list-item').first().waitFor();
    await page.getByTestId('sign-out').click();
    await page.getByRole('heading', { name: 'Sign in to Spanledger' }).waitFor();
    await page.goto(appUrl());
    await page.getByRole('heading', { name: 'Sign in to Spanledger' }).waitFor();
    expect(errors).toEqual([]);
    await page.close();
  });
});
