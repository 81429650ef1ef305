import type { Browser, Page } from 'playwright-core';
import type { StructureFeatureCollection } from '../../shared/src';
import { APP_URL_VARIABLE } from '../support/browser-global-setup';
import { launchBrowser, recordPageErrors, saveScreenshot, signInThroughProvider } from '../support/browser';
import { SignInClient } from '../support/sign-in-client';

const appUrl = () => {
  const url = process.env[APP_URL_VARIABLE];
  if (!url) throw new Error(`${APP_URL_VARIABLE} is not set: run this suite through jest's browser project`);
  return url;
};

/** Demo staff: the South District inspector, a rater of East and South, and the network's manager. */
const SOUTH_INSPECTOR = 'bv-staff-1057';
const SOUTH_RATER = 'bv-staff-2029';
const NETWORK_MANAGER = 'bv-staff-3002';
/** The grey of a structure not rated (frontend/src/app/network-map/rating-colour-scale.ts). */
const NOT_RATED_FILL = '#9ea7ab';
const TABLET = { width: 820, height: 1180 };
const DESK = { width: 1366, height: 960 };

async function choose(page: Page, testId: string, option: string | RegExp): Promise<void> {
  await page.getByTestId(testId).click();
  await page.getByRole('option', { name: option }).first().click();
}

describe('rating journey', () => {
  let browser: Browser;
  let structureId: number;
  let structureNumber: string;

  beforeAll(async () => {
    browser = await launchBrowser();
    const api = new SignInClient(appUrl());
    await api.signInAs(SOUTH_RATER);
    // The last South District structure with no inspection on record (the inspection journey takes the first).
    const south = JSON.parse((await api.request('/api/structures?district=South%20District')).text) as StructureFeatureCollection;
    for (const feature of [...south.features].reverse()) {
      const inspections = JSON.parse((await api.request(`/api/structures/${feature.id}/inspections`)).text) as unknown[];
      if (inspections.length === 0) {
        structureId = Number(feature.id);
        structureNumber = feature.properties.structureNumber;
        break;
      }
    }
  });
  afterAll(() => browser.close());

  /** The structure's row in the map's side list, found by searching its number. */
  async function mapRow(page: Page) {
    await page.goto(`${appUrl()}/?search=${encodeURIComponent(structureNumber)}`);
    const row = page.locator(`[data-testid="structure-list-item"][data-structure-id="${structureId}"]`);
    await row.waitFor();
    return row;
  }

  /** The inspector records two lost strands on girder 2 of span 1 and submits. */
  async function inspectorSubmitsLostStrands(): Promise<void> {
    const inspector = await browser.newPage({ viewport: TABLET, hasTouch: true });
    const errors = recordPageErrors(inspector);
    await signInThroughProvider(inspector, appUrl(), SOUTH_INSPECTOR, `/structures/${structureId}`);
    await inspector.getByTestId('tab-inspections').click();
    await inspector.getByTestId('start-inspection').click();
    await inspector.waitForURL(/\/inspections\/\d+$/);
    await inspector.getByTestId('add-finding').click();
    await choose(inspector, 'finding-span', 'Span 1');
    await choose(inspector, 'finding-girder', /^Girder 2/);
    await choose(inspector, 'finding-kind', 'Lost strands');
    const strands = inspector.locator('[data-testid="strand"][data-index]');
    await strands.first().waitFor();
    const bottomRow = await strands.first().getAttribute('data-row-id');
    const row = inspector.locator(`[data-testid="strand"][data-row-id="${bottomRow}"]`);
    const tapped = inspector.getByTestId('strands-tapped');
    await row.nth(0).tap();
    await tapped.filter({ hasText: /strand 0\b/ }).waitFor();
    await row.nth(1).tap();
    await tapped.filter({ hasText: /0.*1/ }).waitFor();
    await inspector.getByTestId('finding-from').fill('9');
    await inspector.getByTestId('finding-to').fill('12');
    await inspector.getByTestId('finding-severity-severe').click();
    await inspector.getByTestId('save-finding').click();
    await inspector.getByTestId('finding-row').first().waitFor();
    await inspector.getByTestId('submit-inspection').click();
    await inspector.getByTestId('inspection-state').filter({ hasText: 'Submitted' }).waitFor();
    await saveScreenshot(inspector, 'rating-1-inspector-submitted-lost-strands');
    expect(errors).toEqual([]);
    await inspector.close();
  }

  it('an inspector submits lost strands; a rater re-rates the span and submits; the manager approves it as the rating of record', async () => {
    await inspectorSubmitsLostStrands();

    const rater = await browser.newPage({ viewport: DESK });
    const raterErrors = recordPageErrors(rater);
    await signInThroughProvider(rater, appUrl(), SOUTH_RATER, '/');
    // On the map the structure is grey (not rated) and flagged for a rating.
    const before = await mapRow(rater);
    await before.getByTestId('structure-list-due').waitFor();
    expect(await before.getByTestId('structure-list-symbol').getAttribute('data-fill')).toBe(NOT_RATED_FILL);
    await saveScreenshot(rater, 'rating-2a-map-before');
    await rater.goto(`${appUrl()}/structures/${structureId}`);
    await rater.getByTestId('structure-rerating-due').waitFor();
    await rater.getByTestId('tab-ratings').click();
    await rater.getByTestId('rate-span-1').click();
    await rater.getByTestId('rating-choices').waitFor();
    await rater.getByTestId('rerating-due').waitFor();
    const applied = rater.getByTestId('damage-applied').locator('[data-testid^="applied-finding-"]');
    await applied.first().waitFor();
    expect(await applied.count()).toBe(1);
    expect(await applied.first().textContent()).toMatch(/Girder 2 · Lost strands.*strands 0, 1/);
    await saveScreenshot(rater, 'rating-2-rater-choices-with-finding');

    await rater.getByTestId('run-rating').click();
    await rater.waitForURL(/\/ratings\/\d+$/, { timeout: 60_000 });
    const ratingId = Number(rater.url().split('/').pop());
    await rater.getByTestId('rating-figures').waitFor();
    expect(await rater.getByTestId('rating-state').textContent()).toMatch(/Draft/);
    expect(await rater.getByTestId('rating-caution').textContent()).toMatch(/licensed engineer/);
    expect(await rater.getByTestId('rating-warnings').textContent()).toMatch(/shear not rated/);
    expect(await rater.getByTestId('controlling-mark').count()).toBeGreaterThan(0);
    expect(await rater.getByTestId('results-damage').textContent()).toMatch(/Girder 2 · Lost strands.*Applied/);
    await rater.getByTestId('strand-loss-margin').waitFor();
    await saveScreenshot(rater, 'rating-3-rater-results');

    await rater.getByTestId('step-comment').fill('Two lost strands of the November damage inspection applied to girder 2.');
    await rater.getByTestId('submit-rating').click();
    await rater.getByTestId('rating-state').filter({ hasText: 'Waiting for review' }).waitFor();
    // Nobody approves their own rating: the rater is offered no approval.
    expect(await rater.getByTestId('approve-rating').count()).toBe(0);
    await saveScreenshot(rater, 'rating-4-rater-submitted');
    expect(raterErrors).toEqual([]);
    await rater.close();

    const manager = await browser.newPage({ viewport: DESK });
    const managerErrors = recordPageErrors(manager);
    await signInThroughProvider(manager, appUrl(), NETWORK_MANAGER, '/');
    await manager.getByTestId('nav-reviews').click();
    const waiting = manager.locator(`[data-testid="review-row"][data-rating-id="${ratingId}"]`);
    await waiting.waitFor();
    await saveScreenshot(manager, 'rating-5a-manager-review-queue');
    await waiting.getByTestId('open-rating').click();
    await manager.waitForURL(new RegExp(`/ratings/${ratingId}$`));
    await manager.getByTestId('review-comments').filter({ hasText: 'Two lost strands' }).waitFor();
    await manager.getByTestId('step-comment').fill('Checked against the inspection photos.');
    await manager.getByTestId('approve-rating').click();
    await manager.getByTestId('rating-state').filter({ hasText: 'Rating of record' }).waitFor();
    await saveScreenshot(manager, 'rating-5-manager-approved');
    const legalText = (await manager.getByTestId('figure-lowestLegalRf').getByTestId('figure-value').textContent())!.trim();

    await manager.getByTestId('back-to-structure').click();
    await manager.getByTestId('tab-ratings').click();
    await manager.getByTestId('rating-of-record').waitFor();
    expect(await manager.getByTestId('fact-legalRatingFactor').textContent()).toContain(legalText);
    expect(await manager.getByTestId('structure-rerating-due').count()).toBe(0);
    await saveScreenshot(manager, 'rating-6-structure-rating-of-record');

    // The map colours the structure from its new rating of record, and its flag is gone.
    const after = await mapRow(manager);
    await manager.waitForFunction(
      ([id, grey]) => document.querySelector(`[data-structure-id="${id}"] [data-testid="structure-list-symbol"]`)?.getAttribute('data-fill') !== grey,
      [String(structureId), NOT_RATED_FILL] as const,
    );
    expect(await after.getByTestId('structure-list-due').count()).toBe(0);
    await after.click();
    await manager.getByTestId('structure-card').waitFor();
    expect(await manager.getByTestId('structure-card-due').count()).toBe(0);
    await saveScreenshot(manager, 'rating-7-map-after');
    expect(managerErrors).toEqual([]);
    await manager.close();
    expect(structureNumber).toMatch(/^BV-S-/);
  });
});
