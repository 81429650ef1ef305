import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, input, output } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatChipListboxHarness } from '@angular/material/chips/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { By } from '@angular/platform-browser';
import { Router, provideRouter } from '@angular/router';
import { BoundingBox, MAX_STRUCTURES_PER_REQUEST, RatingBasis, StructureFeature } from '@spanledger/shared';

import { SEARCH_DEBOUNCE_MS } from './map-filters.component';
import { NetworkMapPage, VIEW_CHANGE_DEBOUNCE_MS } from './network-map.page';
import { structureAnswer, structureFeature } from './structure-features.testing';
import { StructureListHarness } from './structure-list.testing';
import { StructureMapComponent } from './structure-map.component';

/** Stands in for the Leaflet map, which needs a canvas that jsdom lacks. */
@Component({ selector: 'sl-structure-map', template: '' })
class StructureMapStub {
  readonly structures = input.required<readonly StructureFeature[]>();
  readonly selectedId = input<number | null>(null);
  readonly ratingBasis = input<RatingBasis>('legal');
  readonly fitTo = input<readonly StructureFeature[] | null>(null);
  readonly viewChanged = output<BoundingBox>();
  readonly structureClicked = output<number>();
}

const KANSAS_VIEW: BoundingBox = { minLon: -100, minLat: 37.5, maxLon: -96.5, maxLat: 39.5 };
const NEARBY_VIEW: BoundingBox = { minLon: -98.5, minLat: 38, maxLon: -97.5, maxLat: 38.5 };
/** Holds only NP-0003 of the network below. */
const WESTERN_VIEW: BoundingBox = { minLon: -100, minLat: 38.5, maxLon: -98.8, maxLat: 39.5 };

const network = [
  structureFeature({ id: 1, structureNumber: 'NP-0003' }, [-99.1, 38.9]),
  structureFeature({ id: 2, structureNumber: 'NP-0001', status: 'posted' }, [-98.2, 38.2]),
  structureFeature({ id: 3, structureNumber: 'EV-0002', district: 'East Valley', name: 'Elm Run Bridge', yearBuilt: 1991 }, [-97.9, 38.3]),
];
const DISTRICTS = ['East Valley', 'North Plains'];

function afterDebounce(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, VIEW_CHANGE_DEBOUNCE_MS + 50));
}

describe('NetworkMapPage', () => {
  let fixture: ComponentFixture<NetworkMapPage>;
  let loader: HarnessLoader;
  let server: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [NetworkMapPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    }).overrideComponent(NetworkMapPage, {
      remove: { imports: [StructureMapComponent] },
      add: { imports: [StructureMapStub] },
    });
    server = TestBed.inject(HttpTestingController);
  });

  afterEach(() => server.verify());

  /** Opens the page at a URL, as a reload or a shared link would, and answers the district list. */
  async function openPage(url = '/'): Promise<void> {
    await TestBed.inject(Router).navigateByUrl(url);
    fixture = TestBed.createComponent(NetworkMapPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    server.expectOne('api/districts').flush(DISTRICTS);
  }

  function pageQuery(): Record<string, string> {
    const url = TestBed.inject(Router).parseUrl(TestBed.inject(Router).url);
    return url.queryParams;
  }

  function map(): StructureMapStub {
    return fixture.debugElement.query(By.directive(StructureMapStub)).componentInstance as StructureMapStub;
  }

  /** The one unfiltered request for the whole network, which frames the map and counts the network. */
  function networkRequest(): TestRequest {
    return server.expectOne((r) => r.url === 'api/structures' && r.params.keys().join() === 'limit');
  }

  function viewRequest(): TestRequest {
    return server.expectOne((r) => r.url === 'api/structures' && r.params.has('bbox'));
  }

  async function listedNumbers(): Promise<(string | null)[]> {
    return (await loader.getHarness(StructureListHarness)).getStructureNumbers();
  }

  function mapIds(): number[] {
    return map()
      .structures()
      .map((structure) => structure.properties.id)
      .sort();
  }

  it('loads the whole network, shows progress meanwhile, then lists it and frames the map around it', async () => {
    await openPage();
    const request = networkRequest();
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(1);

    request.flush(structureAnswer(network));

    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001', 'NP-0003']);
    expect(mapIds()).toEqual([1, 2, 3]);
    expect(map().fitTo()).toEqual(network);
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
  });

  it('asks for what is in view once the map settles, and shows the answer on the map and in the list alike', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));

    map().viewChanged.emit(KANSAS_VIEW);
    map().viewChanged.emit(NEARBY_VIEW);
    await afterDebounce();
    const request = viewRequest();
    expect(request.request.params.get('bbox')).toBe('-98.5,38,-97.5,38.5');
    request.flush(structureAnswer([network[1]!, network[2]!], true));

    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001']);
    expect(mapIds()).toEqual([2, 3]);
    expect(fixture.nativeElement.querySelector('[data-testid="truncated-note"]')).not.toBeNull();
    expect(map().fitTo()).toEqual(network);
  });

  it('drops the answer for a view the user has already left', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));

    map().viewChanged.emit(WESTERN_VIEW);
    await afterDebounce();
    const stale = viewRequest();
    map().viewChanged.emit(NEARBY_VIEW);
    await afterDebounce();

    expect(stale.cancelled).toBe(true);
    viewRequest().flush(structureAnswer([network[2]!]));
    expect(await listedNumbers()).toEqual(['EV-0002']);
  });

  it('shows the network it has for a view that holds all of it, such as the view framed around it, without asking again', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));

    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();
    server.expectNone((r) => r.url === 'api/structures');
    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001', 'NP-0003']);

    map().viewChanged.emit(WESTERN_VIEW);
    await afterDebounce();
    viewRequest().flush(structureAnswer([network[0]!]));
    expect(await listedNumbers()).toEqual(['NP-0003']);
  });

  it('asks for a view holding the whole network when the network it has was cut short', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network, true, 48));

    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();
    const request = viewRequest();
    expect(request.request.params.get('bbox')).toBe('-100,37.5,-96.5,39.5');
    request.flush(structureAnswer(network, true, 48));
  });

  it('ignores map moves made before the network has loaded', async () => {
    await openPage();
    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();

    networkRequest().flush(structureAnswer(network));
    server.expectNone((r) => r.params.has('bbox'));
  });

  it('explains in the panel when the structures cannot be loaded', async () => {
    await openPage();
    networkRequest().flush(
      { error: { code: 'internal', message: 'Something went wrong on our side.' }, requestId: 'req-19' },
      { status: 500, statusText: 'Internal Server Error' },
    );
    await fixture.whenStable();

    const error: HTMLElement = fixture.nativeElement.querySelector('[data-testid="structures-error"]');
    expect(error.textContent).toContain('The structures could not be loaded.');
    expect(error.textContent).toContain('Something went wrong on our side. (request req-19)');
  });

  it('keeps the map and the list on the same selection', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));

    map().structureClicked.emit(3);
    await fixture.whenStable();
    const items = await (await loader.getHarness(StructureListHarness)).getItems();
    expect(await items[0]!.isSelected()).toBe(true);

    await items[2]!.click();
    expect(map().selectedId()).toBe(1);
  });

  function filteredRequest(): TestRequest {
    return server.expectOne((r) => r.url === 'api/structures' && r.params.keys().join() !== 'limit');
  }

  function text(testId: string): string | null {
    const element: HTMLElement | null = fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);
    return element?.textContent?.trim() ?? null;
  }

  it('counts what is in view out of the whole network', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network, true, 48));
    await fixture.whenStable();
    expect(text('structure-count')).toBe('48 of 48 structures in view');

    map().viewChanged.emit(NEARBY_VIEW);
    await afterDebounce();
    viewRequest().flush(structureAnswer([network[1]!, network[2]!], false, 2));
    await fixture.whenStable();
    expect(text('structure-count')).toBe('2 of 48 structures in view');
  });

  it('sends a district picked in the panel to the server with the view, keeps it in the URL, and shows the answer on map and list', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));
    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();

    const districts = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="filter-district"]' }));
    await districts.open();
    await districts.clickOptions({ text: 'East Valley' });
    await fixture.whenStable();

    const request = filteredRequest();
    expect(request.request.params.get('bbox')).toBe('-100,37.5,-96.5,39.5');
    expect(request.request.params.get('district')).toBe('East Valley');
    expect(request.request.params.get('limit')).toBe(String(MAX_STRUCTURES_PER_REQUEST));
    expect(pageQuery()).toEqual({ district: 'East Valley' });
    request.flush(structureAnswer([network[2]!]));

    expect(await listedNumbers()).toEqual(['EV-0002']);
    expect(mapIds()).toEqual([3]);
    expect(text('structure-count')).toBe('1 of 3 structures in view');
  });

  it('frames the map around what a search finds in the whole network, beyond the view, and leaves the view be when the search is cleared', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));
    map().viewChanged.emit(NEARBY_VIEW);
    await afterDebounce();
    viewRequest().flush(structureAnswer([network[1]!, network[2]!]));

    const search = await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="filter-search"]' }));
    await search.setValue('NP-0003');
    await new Promise((resolve) => setTimeout(resolve, SEARCH_DEBOUNCE_MS + 50));
    await fixture.whenStable();

    // Asked twice: within the view for the list, and across the network for the map to frame.
    const inView = viewRequest();
    expect(inView.request.params.get('search')).toBe('NP-0003');
    inView.flush(structureAnswer([]));
    const acrossNetwork = server.expectOne((r) => r.url === 'api/structures' && !r.params.has('bbox') && r.params.get('search') === 'NP-0003');
    acrossNetwork.flush(structureAnswer([network[0]!]));
    await fixture.whenStable();
    expect(map().fitTo()).toEqual([network[0]]);

    await search.setValue('');
    await new Promise((resolve) => setTimeout(resolve, SEARCH_DEBOUNCE_MS + 50));
    await fixture.whenStable();
    viewRequest().flush(structureAnswer([network[1]!, network[2]!]));
    server.expectNone((r) => r.url === 'api/structures' && !r.params.has('bbox'));
    await fixture.whenStable();
    expect(map().fitTo()).toEqual([network[0]]);
  });

  it('opens a shared link with its filters: the network once unfiltered to frame the map, then only what matches', async () => {
    await openPage('/?status=posted&conditionAtMost=5&ratingBasis=design-inventory');
    networkRequest().flush(structureAnswer(network));
    await fixture.whenStable();

    const request = filteredRequest();
    expect(request.request.params.has('bbox')).toBe(false);
    expect(request.request.params.get('status')).toBe('posted');
    expect(request.request.params.get('conditionAtMost')).toBe('5');
    request.flush(structureAnswer([network[1]!]));

    expect(await listedNumbers()).toEqual(['NP-0001']);
    expect(mapIds()).toEqual([2]);
    expect(map().fitTo()).toEqual(network);
    expect(map().ratingBasis()).toBe('design-inventory');
    const statuses = await loader.getHarness(MatChipListboxHarness.with({ selector: '[data-testid="filter-status"]' }));
    expect(await Promise.all((await statuses.getChips({ selected: true })).map((chip) => chip.getText()))).toEqual(['Posted']);
  });

  it('clears the filters from the server question and the URL, keeping the colouring', async () => {
    await openPage('/?district=North%20Plains&ratingBand=not-rated&ratingBasis=design-inventory');
    networkRequest().flush(structureAnswer(network));
    await fixture.whenStable();
    filteredRequest().flush(structureAnswer([network[0]!, network[1]!]));
    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();
    const filteredInView = viewRequest();
    expect(filteredInView.request.params.get('ratingBand')).toBe('not-rated');
    expect(filteredInView.request.params.get('ratingBasis')).toBe('design-inventory');
    filteredInView.flush(structureAnswer([network[0]!, network[1]!]));

    await (await loader.getHarness(MatButtonHarness.with({ text: /Clear filters/ }))).click();
    await fixture.whenStable();

    // Unfiltered, the view holds the whole network already loaded: that is the answer.
    server.expectNone((r) => r.url === 'api/structures');
    expect(pageQuery()).toEqual({ ratingBasis: 'design-inventory' });
    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001', 'NP-0003']);

    map().viewChanged.emit(NEARBY_VIEW);
    await afterDebounce();
    const unfiltered = viewRequest();
    expect(unfiltered.request.params.keys()).toEqual(['bbox', 'limit']);
    unfiltered.flush(structureAnswer([network[1]!, network[2]!]));
    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001']);
  });

  it('recolours the map by design inventory without asking the server again, and remembers it in the URL', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));

    await (await loader.getHarness(MatSlideToggleHarness)).toggle();
    await fixture.whenStable();

    expect(map().ratingBasis()).toBe('design-inventory');
    expect(pageQuery()).toEqual({ ratingBasis: 'design-inventory' });
    server.expectNone((r) => r.url === 'api/structures');
  });

  it('opens the card of a structure picked in the list or on the map, with its figures and the link to its page', async () => {
    await openPage();
    networkRequest().flush(structureAnswer(network));
    expect(fixture.nativeElement.querySelector('[data-testid="structure-card"]')).toBeNull();

    const items = await (await loader.getHarness(StructureListHarness)).getItems();
    await items[0]!.click();
    expect(text('structure-card-number')).toBe('EV-0002');
    expect(text('structure-card-name')).toBe('Elm Run Bridge');
    expect(fixture.nativeElement.querySelector('[data-figure="year-built"]').textContent).toContain('1991');
    expect(fixture.nativeElement.querySelector('[data-figure="rating-factor"]').textContent).toContain('Not rated');
    expect(fixture.nativeElement.querySelector('[data-testid="open-structure"]').getAttribute('href')).toBe('/structures/3');

    map().structureClicked.emit(2);
    await fixture.whenStable();
    expect(text('structure-card-number')).toBe('NP-0001');
    expect(fixture.nativeElement.querySelector('[data-figure="status"]').textContent).toContain('Posted');

    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="close-structure-card"]' }))).click();
    expect(fixture.nativeElement.querySelector('[data-testid="structure-card"]')).toBeNull();
    expect(map().selectedId()).toBeNull();
  });

  it('still offers the other filters when the district list cannot be loaded', async () => {
    await TestBed.inject(Router).navigateByUrl('/');
    fixture = TestBed.createComponent(NetworkMapPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    server.expectOne('api/districts').flush(
      { error: { code: 'internal', message: 'Something went wrong on our side.' }, requestId: 'req-20' },
      { status: 500, statusText: 'Internal Server Error' },
    );
    networkRequest().flush(structureAnswer(network));
    await fixture.whenStable();

    expect(text('districts-unavailable')).toBe('The district list could not be loaded.');
    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001', 'NP-0003']);
  });
});
