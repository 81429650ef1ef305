import sharp from 'sharp';
import type { Browser, Page } from 'playwright-core';
import type { InspectionDetail, StructureFeatureCollection } from '../../shared/src';
import { APP_URL_VARIABLE } from '../support/browser-global-setup';
import { launchBrowser, recordPageErrors, saveScreenshot, signInThroughProvider } from '../support/browser';
import { SignInClient } from '../support/sign-in-client';

const appUrl = () => {
  const url = process.env[APP_URL_VARIABLE];
  if (!url) throw new Error(`${APP_URL_VARIABLE} is not set: run this suite through jest's browser project`);
  return url;
};

/** Demo staff: the South District inspector, and a rater of East and South. */
const SOUTH_INSPECTOR = 'bv-staff-1057';
const SOUTH_RATER = 'bv-staff-2029';
/** A tablet held upright. */
const TABLET = { width: 820, height: 1180 };

/** Picks an option of a Material select by its visible text. */
async function choose(page: Page, testId: string, option: string | RegExp): Promise<void> {
  await page.getByTestId(testId).click();
  await page.getByRole('option', { name: option }).first().click();
}

describe('inspection journey', () => {
  let browser: Browser;
  let structureId: number;
  let structureNumber: string;

  beforeAll(async () => {
    browser = await launchBrowser();
    const api = new SignInClient(appUrl());
    await api.signInAs(SOUTH_RATER);
    // A South District structure with no inspection on record, so nothing is carried forward.
    const south = JSON.parse((await api.request('/api/structures?district=South%20District')).text) as StructureFeatureCollection;
    for (const feature of south.features) {
      const inspections = JSON.parse((await api.request(`/api/structures/${feature.id}/inspections`)).text) as unknown[];
      if (inspections.length === 0) {
        structureId = Number(feature.id);
        structureNumber = feature.properties.structureNumber;
        break;
      }
    }
  });
  afterAll(() => browser.close());

  it('an inspector taps two broken strands and adds a photo on a tablet, submits; a rater is alerted and sees them crossed out', async () => {
    const inspector = await browser.newPage({ viewport: TABLET, hasTouch: true });
    const inspectorErrors = recordPageErrors(inspector);
    await signInThroughProvider(inspector, appUrl(), SOUTH_INSPECTOR, `/structures/${structureId}`);
    await inspector.getByTestId('tab-inspections').click();
    await inspector.getByTestId('start-inspection').click();
    await inspector.waitForURL(/\/inspections\/\d+$/);
    const inspectionId = Number(inspector.url().split('/').pop());

    await inspector.getByTestId('add-finding').click();
    await choose(inspector, 'finding-span', 'Span 1');
    await choose(inspector, 'finding-girder', /^Girder 2/);
    await choose(inspector, 'finding-kind', 'Lost strands');
    const strands = inspector.locator('[data-testid="strand"][data-index]');
    await strands.first().waitFor();
    const bottomRow = await strands.first().getAttribute('data-row-id');
    const row = inspector.locator(`[data-testid="strand"][data-row-id="${bottomRow}"]`);
    const tapped = inspector.getByTestId('strands-tapped');
    // Each tap redraws the section: wait for it before the next, so the second tap lands on the new drawing.
    await row.nth(1).tap();
    await tapped.filter({ hasText: /strand 1\b/ }).waitFor();
    await row.nth(2).tap();
    await tapped.filter({ hasText: /1.*2/ }).waitFor();
    await inspector.getByTestId('finding-from').fill('10');
    await inspector.getByTestId('finding-to').fill('11.5');
    await inspector.getByTestId('finding-severity-severe').click();
    await saveScreenshot(inspector, 'inspection-1-finding-tapped');
    await inspector.getByTestId('save-finding').click();
    await inspector.getByTestId('finding-row').first().waitFor();

    // A drawn picture, not a photograph: the demo keeps no real photos.
    const picture = await sharp({ create: { width: 480, height: 320, channels: 3, background: '#9aa6a0' } }).jpeg().toBuffer();
    await inspector.getByTestId('photo-input').first().setInputFiles({ name: 'broken-strands.jpg', mimeType: 'image/jpeg', buffer: picture });
    await inspector.getByTestId('photo-thumbnail').first().waitFor();
    await saveScreenshot(inspector, 'inspection-2-finding-and-photo');

    await inspector.getByTestId('submit-inspection').click();
    await inspector.getByTestId('inspection-state').filter({ hasText: 'Submitted' }).waitFor();
    await saveScreenshot(inspector, 'inspection-3-submitted');
    expect(inspectorErrors).toEqual([]);
    await inspector.close();

    const api = new SignInClient(appUrl());
    await api.signInAs(SOUTH_RATER);
    const submitted = JSON.parse((await api.request(`/api/inspections/${inspectionId}`)).text) as InspectionDetail;
    expect(submitted.state).toBe('submitted');
    expect(submitted.photoIds).toHaveLength(1);
    const finding = submitted.findings[0]!;
    expect(finding.strands).toEqual({ rowId: bottomRow, strands: [1, 2] });

    const rater = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const raterErrors = recordPageErrors(rater);
    await signInThroughProvider(rater, appUrl(), SOUTH_RATER);
    await rater.getByTestId('alerts-button').click();
    const alert = rater.getByTestId('alert-item').filter({ hasText: structureNumber });
    await alert.waitFor();
    await saveScreenshot(rater, 'inspection-4-rater-alert');
    await alert.getByTestId('alert-girder-link').click();
    await rater.waitForURL(new RegExp(`/girders/${finding.girderId}$`));
    const lost = rater.locator(`[data-testid="strand"][data-row-id="${bottomRow}"][data-state="lost"]`);
    await lost.nth(1).waitFor();
    expect(await lost.evaluateAll((items) => items.map((item) => Number(item.getAttribute('data-index'))))).toEqual([1, 2]);
    await saveScreenshot(rater, 'inspection-5-girder-strands-crossed-out');
    expect(raterErrors).toEqual([]);
    await rater.close();
  });
});
