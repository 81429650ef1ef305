import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { StructureSummary } from '@spanledger/shared';

import { MAX_LISTED_STRUCTURES, StructureListComponent } from './structure-list.component';
import { structureFeature } from './structure-features.testing';
import { StructureListHarness } from './structure-list.testing';

function summary(id: number, structureNumber: string, overrides: Partial<StructureSummary> = {}): StructureSummary {
  return structureFeature({ id, structureNumber, ...overrides }).properties;
}

describe('StructureListComponent', () => {
  let fixture: ComponentFixture<StructureListComponent>;

  interface ShowOptions {
    readonly truncated?: boolean;
    readonly selectedId?: number | null;
    readonly total?: number;
    readonly networkTotal?: number | null;
    readonly filtered?: boolean;
  }

  function show(structures: StructureSummary[], options: ShowOptions = {}): void {
    fixture.componentRef.setInput('structures', structures);
    fixture.componentRef.setInput('truncated', options.truncated ?? false);
    fixture.componentRef.setInput('selectedId', options.selectedId ?? null);
    fixture.componentRef.setInput('total', options.total ?? structures.length);
    fixture.componentRef.setInput('networkTotal', options.networkTotal ?? null);
    fixture.componentRef.setInput('filtered', options.filtered ?? false);
  }

  function text(testId: string): string | null {
    const element: HTMLElement | null = fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);
    return element?.textContent?.trim() ?? null;
  }

  /** The fixture's root is the list itself. */
  function list(): Promise<StructureListHarness> {
    return TestbedHarnessEnvironment.harnessForFixture(fixture, StructureListHarness);
  }

  async function listItems() {
    return (await list()).getItems();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [StructureListComponent] });
    fixture = TestBed.createComponent(StructureListComponent);
  });

  it('lists exactly the structures given, in structure-number order', async () => {
    show([summary(3, 'NP-0010'), summary(1, 'NP-0002'), summary(2, 'EV-0100'), summary(4, 'NP-0009')]);

    const numbers = await (await list()).getStructureNumbers();
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
    expect(await item!.getCrossing()).toBe('SR 14 over Walnut River');
    expect(await item!.getPlace()).toBe('South Hills');
  });

  it('adds the status to the district of a posted or closed structure', async () => {
    show([summary(1, 'A-1', { status: 'posted', district: 'South Hills' }), summary(2, 'A-2', { status: 'closed', district: 'East Valley' })]);

    const places = await Promise.all((await listItems()).map((item) => item.getPlace()));
    expect(places).toEqual(['South Hills · Posted', 'East Valley · Closed']);
  });

  it('counts the structures in view that match, out of the whole network once it is known', async () => {
    show([summary(1, 'A-1'), summary(2, 'A-2'), summary(3, 'A-3')]);
    await fixture.whenStable();
    expect(text('structure-count')).toBe('3 structures in view');

    show([summary(1, 'A-1')], { networkTotal: 48 });
    await fixture.whenStable();
    expect(text('structure-count')).toBe('1 of 48 structures in view');

    show([summary(1, 'A-1')], { truncated: true, total: 12_500, networkTotal: 20_000 });
    await fixture.whenStable();
    expect(text('structure-count')).toBe('12,500 of 20,000 structures in view');
  });

  it('notes when the server cut the list short, and only then', async () => {
    show([summary(1, 'A-1'), summary(2, 'A-2')], { truncated: true, total: 9 });
    await fixture.whenStable();
    expect(text('truncated-note')).toBe('Only the first 2 are listed. Zoom in or filter to see the rest.');

    show([summary(1, 'A-1'), summary(2, 'A-2')], { truncated: false });
    await fixture.whenStable();
    expect(text('truncated-note')).toBeNull();
  });

  it('lists at most a few hundred structures, the first by number, and says the rest are on the map', async () => {
    const many = Array.from({ length: MAX_LISTED_STRUCTURES + 50 }, (_, index) => summary(index + 1, `A-${MAX_LISTED_STRUCTURES + 50 - index}`));
    show(many, { total: many.length });
    await fixture.whenStable();
    const items = fixture.nativeElement.querySelectorAll('[data-testid="structure-list-item"]') as NodeListOf<HTMLElement>;
    expect(items).toHaveLength(MAX_LISTED_STRUCTURES);
    expect(items[0]!.dataset['structureNumber']).toBe('A-1');
    expect(text('truncated-note')).toBe(`Only the first ${MAX_LISTED_STRUCTURES} are listed. Zoom in or filter to see the rest.`);
    expect(text('structure-count')).toBe(`${many.length} structures in view`);
  });

  it('says so when nothing is in view, and whether filters are why', async () => {
    show([]);
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="structure-list-item"]')).toBeNull();
    expect(text('structure-list-empty')).toBe('No structures in this part of the map.');

    show([], { filtered: true });
    await fixture.whenStable();
    expect(text('structure-list-empty')).toBe('No structures in this part of the map match the filters.');
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

    const highlighted = await Promise.all((await listItems()).map((item) => item.isSelected()));
    expect(highlighted).toEqual([false, true, false]);
  });
});
