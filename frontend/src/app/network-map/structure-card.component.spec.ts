import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCardHarness } from '@angular/material/card/testing';
import { provideRouter } from '@angular/router';
import { RESULT_CAUTION, RatingBasis, StructureSummary } from '@spanledger/shared';

import { StructureCardComponent } from './structure-card.component';
import { structureFeature } from './structure-features.testing';

const WALNUT_FORD: StructureSummary = structureFeature({
  id: 417,
  structureNumber: 'SR-0417',
  name: 'Walnut Ford Bridge',
  routeCarried: 'SR 14',
  featureCrossed: 'Walnut River',
  district: 'South Hills',
  yearBuilt: 1968,
  adt: 12_400,
  adtt: 1_150,
  status: 'posted',
  lowestCondition: 4,
}).properties;

describe('StructureCardComponent', () => {
  let fixture: ComponentFixture<StructureCardComponent>;
  let loader: HarnessLoader;

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [StructureCardComponent], providers: [provideRouter([])] });
    fixture = TestBed.createComponent(StructureCardComponent);
    loader = TestbedHarnessEnvironment.loader(fixture);
  });

  async function show(structure: StructureSummary, ratingBasis: RatingBasis = 'legal'): Promise<void> {
    fixture.componentRef.setInput('structure', structure);
    fixture.componentRef.setInput('ratingBasis', ratingBasis);
    await fixture.whenStable();
  }

  function figures(): Record<string, string> {
    const rows: HTMLElement[] = Array.from(fixture.nativeElement.querySelectorAll('[data-testid="structure-card-figure"]'));
    return Object.fromEntries(rows.map((row) => [row.querySelector('dt')!.textContent!.trim(), row.querySelector('dd')!.textContent!.trim()]));
  }

  it('shows the key figures of the structure', async () => {
    await show(WALNUT_FORD);

    const card = await loader.getHarness(MatCardHarness);
    expect(await card.getTitleText()).toBe('SR-0417');
    expect(await card.getSubtitleText()).toBe('Walnut Ford Bridge');
    expect(figures()).toEqual({
      Carries: 'SR 14 over Walnut River',
      District: 'South Hills',
      'Year built': '1968',
      'ADT / ADTT': '12,400 / 1,150',
      Status: 'Posted',
      'Lowest condition rating': '4',
      'Rating factor (legal loads)': 'Not rated',
    });
  });

  it('says what is not recorded rather than leaving it blank', async () => {
    await show({ ...WALNUT_FORD, yearBuilt: null, adt: null, adtt: null, lowestCondition: null });

    expect(figures()).toMatchObject({ 'Year built': 'Not recorded', 'ADT / ADTT': '— / —', 'Lowest condition rating': 'Not recorded' });
  });

  it('links to the structure page', async () => {
    await show(WALNUT_FORD);

    const link: HTMLAnchorElement = fixture.nativeElement.querySelector('[data-testid="open-structure"]');
    expect(link.textContent?.trim()).toBe('Open structure');
    expect(link.getAttribute('href')).toBe('/structures/417');
  });

  it('gives the rating factor of record the map is coloured by, with the caution, once there is one', async () => {
    const rated = { ...WALNUT_FORD, legalRatingFactor: 0.874, designInventoryRatingFactor: 0.62 };
    const caution = () => fixture.nativeElement.querySelector('[data-testid="structure-card-caution"]')?.textContent?.trim() ?? null;

    await show(rated);
    expect(figures()['Rating factor (legal loads)']).toBe('0.87');
    expect(caution()).toBe(RESULT_CAUTION);

    await show(rated, 'design-inventory');
    expect(figures()['Rating factor (design inventory)']).toBe('0.62');

    await show(WALNUT_FORD);
    expect(caution()).toBeNull();
  });

  it('asks to close from its close button and from Escape', async () => {
    await show(WALNUT_FORD);
    let closings = 0;
    fixture.componentInstance.closed.subscribe(() => (closings += 1));

    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="close-structure-card"]' }))).click();
    const card: HTMLElement = fixture.nativeElement.querySelector('[data-testid="structure-card"]');
    card.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape' }));

    expect(closings).toBe(2);
  });
});
