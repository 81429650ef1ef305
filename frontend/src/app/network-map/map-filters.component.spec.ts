import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatChipListboxHarness } from '@angular/material/chips/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import { MapFilters, NO_FILTERS } from './map-filters';
import { MapFiltersComponent, SEARCH_DEBOUNCE_MS } from './map-filters.component';

const DISTRICTS = ['East Valley', 'North Plains', 'South Hills'];

function afterSearchDebounce(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, SEARCH_DEBOUNCE_MS + 50));
}

describe('MapFiltersComponent', () => {
  let fixture: ComponentFixture<MapFiltersComponent>;
  let loader: HarnessLoader;
  let asked: MapFilters[];

  async function show(filters: MapFilters, options: { districts?: string[]; districtsUnavailable?: boolean } = {}): Promise<void> {
    fixture.componentRef.setInput('filters', filters);
    fixture.componentRef.setInput('districts', options.districts ?? DISTRICTS);
    fixture.componentRef.setInput('districtsUnavailable', options.districtsUnavailable ?? false);
    await fixture.whenStable();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [MapFiltersComponent] });
    fixture = TestBed.createComponent(MapFiltersComponent);
    loader = TestbedHarnessEnvironment.loader(fixture);
    asked = [];
    fixture.componentInstance.filtersChange.subscribe((filters) => asked.push(filters));
  });

  const search = () => loader.getHarness(MatInputHarness.with({ selector: '[data-testid="filter-search"]' }));
  const districtSelect = () => loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="filter-district"]' }));
  const conditionSelect = () => loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="filter-condition"]' }));
  const bandChips = () => loader.getHarness(MatChipListboxHarness.with({ selector: '[data-testid="filter-rating-band"]' }));
  const statusChips = () => loader.getHarness(MatChipListboxHarness.with({ selector: '[data-testid="filter-status"]' }));
  const clearButton = () => loader.getHarness(MatButtonHarness.with({ text: /Clear filters/ }));

  async function selectedChips(listbox: Promise<MatChipListboxHarness>): Promise<string[]> {
    const chips = await (await listbox).getChips({ selected: true });
    return Promise.all(chips.map((chip) => chip.getText()));
  }

  it('shows the filters it is given, as a shared link would set them', async () => {
    await show({
      districts: ['South Hills'],
      ratingBands: ['below-1'],
      conditionAtMost: 0,
      statuses: ['posted', 'closed'],
      reratingDue: true,
      search: 'walnut',
      ratingBasis: 'design-inventory',
    });

    expect(await (await search()).getValue()).toBe('walnut');
    expect(await (await districtSelect()).getValueText()).toBe('South Hills');
    expect(await (await conditionSelect()).getValueText()).toBe('0');
    expect(await selectedChips(bandChips())).toEqual(['Below 1.00']);
    expect(await selectedChips(statusChips())).toEqual(['Posted', 'Closed']);
    expect(await (await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="filter-rerating-due"]' }))).isChecked()).toBe(true);
    expect(fixture.nativeElement.textContent).toContain('Rating band (design inventory)');
    expect(asked).toEqual([]);
  });

  it('asks for only the structures due for re-rating when that is ticked', async () => {
    await show(NO_FILTERS);
    await (await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="filter-rerating-due"]' }))).check();
    expect(asked.at(-1)).toEqual({ ...NO_FILTERS, reratingDue: true });
  });

  it('asks for the districts picked from the network list', async () => {
    await show(NO_FILTERS);
    const select = await districtSelect();
    await select.open();
    expect(await Promise.all((await select.getOptions()).map((option) => option.getText()))).toEqual(DISTRICTS);

    await select.clickOptions({ text: 'North Plains' });
    expect(asked.at(-1)).toEqual({ ...NO_FILTERS, districts: ['North Plains'] });
    await select.clickOptions({ text: 'East Valley' });
    expect(asked.at(-1)).toEqual({ ...NO_FILTERS, districts: ['East Valley', 'North Plains'] });
  });

  it('asks for a rating band, a status and a lowest condition at once, keeping the colouring', async () => {
    const colouredByDesign = { ...NO_FILTERS, ratingBasis: 'design-inventory' as const };
    await show(colouredByDesign);

    await (await bandChips()).selectChips({ text: 'Not rated' });
    expect(asked.at(-1)).toEqual({ ...colouredByDesign, ratingBands: ['not-rated'] });

    await show(asked.at(-1)!);
    await (await statusChips()).selectChips({ text: 'Posted' });
    expect(asked.at(-1)).toEqual({ ...colouredByDesign, ratingBands: ['not-rated'], statuses: ['posted'] });

    await show(asked.at(-1)!);
    const condition = await conditionSelect();
    await condition.open();
    await condition.clickOptions({ text: '4' });
    expect(asked.at(-1)).toEqual({ ...colouredByDesign, ratingBands: ['not-rated'], statuses: ['posted'], conditionAtMost: 4 });
  });

  it('searches once typing pauses, with the text trimmed', async () => {
    await show(NO_FILTERS);

    await (await search()).setValue('  plum ');
    expect(asked).toEqual([]);
    await afterSearchDebounce();

    expect(asked).toEqual([{ ...NO_FILTERS, search: 'plum' }]);
  });

  it('keeps the spaces being typed when the trimmed search comes back from the URL', async () => {
    await show(NO_FILTERS);
    const input = await search();
    await input.setValue('plum ');
    await afterSearchDebounce();

    await show({ ...NO_FILTERS, search: 'plum' });
    expect(await input.getValue()).toBe('plum ');
  });

  it('names the search field and the rule when the text is too long, and does not send it', async () => {
    await show(NO_FILTERS);

    await (await search()).setValue('x'.repeat(101));
    await afterSearchDebounce();

    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Structure number or name' }));
    expect(await field.getTextErrors()).toEqual(['Search: at most 100 characters']);
    expect(asked).toEqual([]);
  });

  it('clears every filter but keeps the colouring, and offers to only when something filters', async () => {
    await show(NO_FILTERS);
    expect(await (await clearButton()).isDisabled()).toBe(true);

    const filtered: MapFilters = {
      districts: ['South Hills'],
      ratingBands: ['below-1'],
      conditionAtMost: 3,
      statuses: ['closed'],
      reratingDue: true,
      search: 'walnut',
      ratingBasis: 'design-inventory',
    };
    await show(filtered);
    await (await clearButton()).click();

    expect(asked).toEqual([{ ...NO_FILTERS, ratingBasis: 'design-inventory' }]);
    expect(await (await search()).getValue()).toBe('');
    expect(await selectedChips(statusChips())).toEqual([]);
  });

  it('keeps a district a link names that the network list lacks, so it can be unticked', async () => {
    await show({ ...NO_FILTERS, districts: ['Old West'] });
    const select = await districtSelect();
    await select.open();

    expect(await Promise.all((await select.getOptions()).map((option) => option.getText()))).toEqual([...DISTRICTS, 'Old West']);
    await select.clickOptions({ text: 'Old West' });
    expect(asked.at(-1)).toEqual(NO_FILTERS);
  });

  it('says so when the district list could not be loaded', async () => {
    await show(NO_FILTERS, { districts: [], districtsUnavailable: true });

    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'District' }));
    expect(await field.getTextHints()).toEqual(['The district list could not be loaded.']);
  });
});
