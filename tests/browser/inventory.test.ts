import type { Browser, Page } from 'playwright-core';
import type { StructureDetail, StructureFeatureCollection } from '../../shared/src';
import { APP_URL_VARIABLE } from '../support/browser-global-setup';
import { launchBrowser, recordPageErrors, saveScreenshot, signInThroughProvider } from '../support/browser';
import { SignInClient } from '../support/sign-in-client';

const appUrl = () => {
  const url = process.env[APP_URL_VARIABLE];
  if (!url) throw new Error(`${APP_URL_VARIABLE} is not set: run this suite through jest's browser project`);
  return url;
};

/** Demo staff: a manager of the whole network, and a rater of Central District. */
const MANAGER = 'bv-staff-3002';
const CENTRAL_RATER = 'bv-staff-2013';

/** Polls a condition in the page, since the zoneless app renders after its data arrives. */
async function eventually<T>(read: () => Promise<T>, accept: (value: T) => boolean, what: string): Promise<T> {
  let last: T | undefined;
  for (let attempt = 0; attempt < 100; attempt += 1) {
    last = await read();
    if (accept(last)) return last;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`${what} did not happen; last seen: ${JSON.stringify(last)}`);
}

const listed = (page: Page) =>
  page.getByTestId('structure-list-item').evaluateAll((items) => items.map((item) => ({ number: item.getAttribute('data-structure-number'), district: item.getAttribute('data-district') })));

describe('inventory journeys', () => {
  let browser: Browser;
  let api: SignInClient;

  beforeAll(async () => {
    browser = await launchBrowser();
    api = new SignInClient(appUrl());
    await api.signInAs(MANAGER);
  });
  afterAll(() => browser.close());

  it('a manager filters the map by district and opens a structure from its card', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    const pageErrors = recordPageErrors(page);
    await signInThroughProvider(page, appUrl(), MANAGER);
    const everything = await eventually(() => listed(page), (items) => items.length >= 40, 'the whole network listed');

    await page.getByTestId('filter-district').click();
    await page.getByRole('option', { name: 'East District' }).click();
    await page.keyboard.press('Escape');
    const east = JSON.parse((await api.request('/api/structures?district=East%20District')).text) as StructureFeatureCollection;
    const eastOnly = await eventually(
      () => listed(page),
      (items) => items.length === east.total && items.every((item) => item.district === 'East District'),
      'the list narrowed to East District',
    );
    expect(eastOnly.length).toBeLessThan(everything.length);
    expect(page.url()).toContain('district=East');
    await eventually(() => page.getByTestId('network-map').getAttribute('data-marker-count'), (count) => Number(count) === east.total, 'the map narrowed to East District');
    await saveScreenshot(page, 'inventory-1-map-filtered-by-district');

    const first = page.getByTestId('structure-list-item').first();
    const structureNumber = await first.getAttribute('data-structure-number');
    await first.click();
    const card = page.getByTestId('structure-card');
    await card.waitFor();
    expect(await card.getByTestId('structure-card-number').textContent()).toContain(structureNumber);
    await saveScreenshot(page, 'inventory-2-structure-card');

    await page.getByTestId('open-structure').click();
    await page.waitForURL(/\/structures\/\d+$/);
    await eventually(() => page.getByTestId('structure-title').textContent(), (title) => (title ?? '').includes(structureNumber!), 'the structure page');
    expect(await page.getByTestId('structure-facts').textContent()).toContain('East District');
    await page.getByTestId('span-row').first().waitFor();
    await saveScreenshot(page, 'inventory-3-structure-page');
    expect(pageErrors).toEqual([]);
    await page.close();
  });

  it('a rater edits a span of their district and sees the change in the history tab, in either units', async () => {
    const structures = JSON.parse((await api.request('/api/structures?district=Central%20District&limit=1')).text) as StructureFeatureCollection;
    const id = structures.features[0]!.id;
    const structure = JSON.parse((await api.request(`/api/structures/${id}`)).text) as StructureDetail;
    const span = JSON.parse((await api.request(`/api/spans/${structure.spans[0]!.id}`)).text) as { haunchMm: number };
    const newHaunchMm = span.haunchMm + 15;

    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const pageErrors = recordPageErrors(page);
    await signInThroughProvider(page, appUrl(), CENTRAL_RATER, `/structures/${id}`);
    await page.getByTestId('units-si').click();
    await page.locator('[data-testid="span-row"][data-span-index="1"]').click();
    await page.getByTestId('edit-span').click();
    const haunch = page.getByTestId('field-haunchMm');
    await haunch.fill(String(newHaunchMm));
    await saveScreenshot(page, 'inventory-4-span-form');
    await page.getByTestId('save-span').click();
    await page.getByTestId('span-form').waitFor({ state: 'detached' });

    await page.getByTestId('tab-history').click();
    const change = page.locator('[data-testid="history-change"][data-field="haunchMm"]').first();
    await change.waitFor();
    expect(await page.getByTestId('history-what').first().textContent()).toMatch(/Span 1/);
    expect(await page.getByTestId('history-row').first().textContent()).toContain('Priya Halloran');
    expect(await change.textContent()).toMatch(new RegExp(`${span.haunchMm}.*→.*${newHaunchMm}`));
    await saveScreenshot(page, 'inventory-5-history-si');

    // The same change read in US customary units: the haunch in inches.
    await page.getByTestId('units-us').click();
    const inches = (newHaunchMm / 25.4).toFixed(2);
    await eventually(() => change.textContent(), (text) => (text ?? '').includes(inches), `the haunch shown as ${inches} in`);
    await saveScreenshot(page, 'inventory-6-history-us');

    const stored = JSON.parse((await api.request(`/api/spans/${structure.spans[0]!.id}`)).text) as { haunchMm: number };
    expect(stored.haunchMm).toBe(newHaunchMm);
    expect(pageErrors).toEqual([]);
    await page.close();
  });
});
