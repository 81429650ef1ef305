import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatActionListHarness } from '@angular/material/list/testing';
import { StructureSummary } from '@spanledger/shared';

import { StructureListComponent } from './structure-list.component';
import { structureFeature } from './structure-features.testing';

/** The class that paints a list item as the selected structure. */
const SELECTED_ITEM = 'selected-structure';

function summary(id: number, structureNumber: string, overrides: Partial<StructureSummary> = {}): StructureSummary {
  return structureFeature({ id, structureNumber, ...overrides }).properties;
}

describe('StructureListComponent', () => {
  let fixture: ComponentFixture<StructureListComponent>;
  let loader: HarnessLoader;

  function show(structures: StructureSummary[], options: { truncated?: boolean; selectedId?: number | null } = {}): void {
    fixture.componentRef.setInput('structures', structures);
    fixture.componentRef.setInput('truncated', options.truncated ?? false);
    fixture.componentRef.setInput('selectedId', options.selectedId ?? null);
  }

  function text(testId: string): string | null {
    const element: HTMLElement | null = fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);
    return element?.textContent?.trim() ?? null;
  }

  async function listItems() {
    const list = await loader.getHarness(MatActionListHarness);
    return list.getItems();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [StructureListComponent] });
    fixture = TestBed.createComponent(StructureListComponent);
    loader = TestbedHarnessEnvironment.loader(fixture);
  });

  it('lists exactly the structures given, in structure-number order', async () => {
    show([summary(3, 'NP-0010'), summary(1, 'NP-0002'), summary(2, 'EV-0100'), summary(4, 'NP-0009')]);

    const items = await listItems();
    const numbers = await Promise.all(items.map(async (item) => (await item.host()).getAttribute('data-structure-number')));
    expect(numbers).toEqual(['EV-0100', 'NP-0002', 'NP-0009', 'NP-0010']);
  });

  it('orders numbers by their digits, not character by character', async () => {
    show([summary(1, 'B-10'), summary(2, 'B-9'), summary(3, 'B-100')]);

    const titles = await Promise.all((await listItems()).map((item) => item.getTitle()));
    expect(titles.map((title) => title.split(' ')[0])).toEqual(['B-9', 'B-10', 'B-100']);
  });

  it('shows number, name, route over feature crossed and district for each structure', async () => {
    show([
      summary(7, 'SR-0417', { name: 'Walnut Ford Bridge', routeCarried: 'SR 14', featureCrossed: 'Walnut River', district: 'South Hills' }),
    ]);

    const [item] = await listItems();
    expect(await item!.getTitle()).toBe('SR-0417 Walnut Ford Bridge');
    expect(await item!.getSecondaryText()).toBe('SR 14 over Walnut River');
    expect(await item!.getTertiaryText()).toBe('South Hills');
  });

  it('counts the structures in view', async () => {
    show([summary(1, 'A-1'), summary(2, 'A-2'), summary(3, 'A-3')]);
    await fixture.whenStable();
    expect(text('structure-count')).toBe('3 structures in view');

    show([summary(1, 'A-1')]);
    await fixture.whenStable();
    expect(text('structure-count')).toBe('1 structure in view');
  });

  it('notes when the server cut the list short, and only then', async () => {
    show([summary(1, 'A-1'), summary(2, 'A-2')], { truncated: true });
    await fixture.whenStable();
    expect(text('truncated-note')).toBe('Only the first 2 are shown. Zoom in to see the rest.');

    show([summary(1, 'A-1'), summary(2, 'A-2')], { truncated: false });
    await fixture.whenStable();
    expect(text('truncated-note')).toBeNull();
  });

  it('says so when nothing is in view', async () => {
    show([]);

    expect(await listItems()).toHaveLength(0);
    expect(fixture.nativeElement.textContent).toContain('No structures in this part of the map.');
  });

  it('emits the id of the structure picked', async () => {
    show([summary(11, 'A-2'), summary(12, 'A-1')]);
    const picked: number[] = [];
    fixture.componentInstance.structureSelected.subscribe((id) => picked.push(id));

    const [first, second] = await listItems();
    await second!.click();
    await first!.click();

    expect(picked).toEqual([11, 12]);
  });

  it('highlights the selected structure', async () => {
    show([summary(1, 'A-1'), summary(2, 'A-2'), summary(3, 'A-3')], { selectedId: 2 });

    const highlighted = await Promise.all((await listItems()).map(async (item) => (await item.host()).hasClass(SELECTED_ITEM)));
    expect(highlighted).toEqual([false, true, false]);
  });
});
