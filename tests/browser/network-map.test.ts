import fs from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import type { StructureFeatureCollection } from '../../shared/src';
import { APP_URL_VARIABLE } from '../support/browser-global-setup';
import { launchBrowser, recordPageErrors, recordRequests, saveScreenshot, signInThroughProvider } from '../support/browser';
import { SignInClient } from '../support/sign-in-client';

const appUrl = () => {
  const url = process.env[APP_URL_VARIABLE];
  if (!url) throw new Error(`${APP_URL_VARIABLE} is not set: run this suite through jest's browser project`);
  return url;
};

async function markerCount(page: Page): Promise<number> {
  return Number(await page.getByTestId('network-map').getAttribute('data-marker-count'));
}

async function listedStructureNumbers(page: Page): Promise<string[]> {
  return page.getByTestId('structure-list-item').evaluateAll((items) => items.map((item) => item.getAttribute('data-structure-number') ?? ''));
}

/** Polls until the map and the list agree on a non-empty set, since the map redraws after a debounce. */
async function waitForMapAndListToAgree(page: Page, expectedCount: (count: number) => boolean): Promise<string[]> {
  let last = { markers: -1, listed: [] as string[] };
  for (let attempt = 0; attempt < 100; attempt += 1) {
    const markers = await markerCount(page);
    const listed = await listedStructureNumbers(page);
    last = { markers, listed };
    if (markers === listed.length && expectedCount(markers)) return listed;
    await page.waitForTimeout(100);
  }
  throw new Error(`map and list did not agree: ${last.markers} markers, ${last.listed.length} listed`);
}

describe('network map journey', () => {
  let browser: Browser;
  let demoStructureNumbers: string[];

  beforeAll(async () => {
    browser = await launchBrowser();
    const client = new SignInClient(appUrl());
    await client.signInAs('bv-staff-2013');
    const all = JSON.parse((await client.request('/api/structures?limit=5000')).text) as StructureFeatureCollection;
    demoStructureNumbers = all.features.map((f) => f.properties.structureNumber).sort();
  });
  afterAll(() => browser.close());

  it('shows the demo structures on the map and the same structures in the list, with no request leaving 127.0.0.1', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    const requests = recordRequests(page);
    const pageErrors = recordPageErrors(page);
    const basemap = page.waitForResponse((response) => response.url().endsWith('/basemap/states-10m.json') && response.ok());
    await signInThroughProvider(page, appUrl(), 'bv-staff-2013');
    await basemap;

    await page.getByText('Spanledger').first().waitFor();
    expect(demoStructureNumbers.length).toBeGreaterThanOrEqual(40);
    const listed = await waitForMapAndListToAgree(page, (count) => count === demoStructureNumbers.length);
    expect([...listed].sort()).toEqual(demoStructureNumbers);

    const screenshot = await saveScreenshot(page, 'network-map');
    expect(fs.statSync(screenshot).size).toBeGreaterThan(10_000);

    const hosts = new Set(requests.filter((url) => /^https?:/.test(url)).map((url) => new URL(url).hostname));
    expect([...hosts]).toEqual(['127.0.0.1']);
    expect(requests.some((url) => url.includes('/api/structures'))).toBe(true);
    expect(pageErrors).toEqual([]);
    await page.close();
  });

  it('keeps the list in step with the map extent when the map zooms in', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    await signInThroughProvider(page, appUrl(), 'bv-staff-2013');
    await waitForMapAndListToAgree(page, (count) => count === demoStructureNumbers.length);

    const map = page.getByTestId('network-map');
    const box = await map.boundingBox();
    if (!box) throw new Error('the map has no size');
    // Zoom in on the map's centre with the mouse wheel, as a user would, until fewer structures are in view.
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    for (let step = 0; step < 3; step += 1) {
      await page.mouse.wheel(0, -400);
      await page.waitForTimeout(300);
    }
    const listed = await waitForMapAndListToAgree(page, (count) => count < demoStructureNumbers.length);
    expect(listed.every((number) => demoStructureNumbers.includes(number))).toBe(true);
    await saveScreenshot(page, 'network-map-zoomed');
    await page.close();
  });
});
