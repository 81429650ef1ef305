import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, input, output } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatActionListHarness } from '@angular/material/list/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { By } from '@angular/platform-browser';
import { BoundingBox, StructureFeature } from '@spanledger/shared';

import { NetworkMapPage, VIEW_CHANGE_DEBOUNCE_MS } from './network-map.page';
import { structureAnswer, structureFeature } from './structure-features.testing';
import { StructureMapComponent } from './structure-map.component';

/** Stands in for the Leaflet map, which needs a canvas that jsdom lacks. */
@Component({ selector: 'sl-structure-map', template: '' })
class StructureMapStub {
  readonly structures = input.required<readonly StructureFeature[]>();
  readonly selectedId = input<number | null>(null);
  readonly fitTo = input<readonly StructureFeature[] | null>(null);
  readonly viewChanged = output<BoundingBox>();
  readonly structureClicked = output<number>();
}

const KANSAS_VIEW: BoundingBox = { minLon: -100, minLat: 37.5, maxLon: -96.5, maxLat: 39.5 };
const NEARBY_VIEW: BoundingBox = { minLon: -98.5, minLat: 38, maxLon: -97.5, maxLat: 38.5 };

const network = [
  structureFeature({ id: 1, structureNumber: 'NP-0003' }, [-99.1, 38.9]),
  structureFeature({ id: 2, structureNumber: 'NP-0001' }, [-98.2, 38.2]),
  structureFeature({ id: 3, structureNumber: 'EV-0002' }, [-97.9, 38.3]),
];

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
      providers: [provideHttpClient(), provideHttpClientTesting()],
    }).overrideComponent(NetworkMapPage, {
      remove: { imports: [StructureMapComponent] },
      add: { imports: [StructureMapStub] },
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(NetworkMapPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
  });

  afterEach(() => server.verify());

  function map(): StructureMapStub {
    return fixture.debugElement.query(By.directive(StructureMapStub)).componentInstance as StructureMapStub;
  }

  function networkRequest(): TestRequest {
    return server.expectOne((r) => r.url === 'api/structures' && !r.params.has('bbox'));
  }

  function viewRequest(): TestRequest {
    return server.expectOne((r) => r.url === 'api/structures' && r.params.has('bbox'));
  }

  async function listedNumbers(): Promise<(string | null)[]> {
    const items = await (await loader.getHarness(MatActionListHarness)).getItems();
    return Promise.all(items.map(async (item) => (await item.host()).getAttribute('data-structure-number')));
  }

  function mapIds(): number[] {
    return map()
      .structures()
      .map((structure) => structure.properties.id)
      .sort();
  }

  it('loads the whole network, shows progress meanwhile, then lists it and frames the map around it', async () => {
    await fixture.whenStable();
    const request = networkRequest();
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(1);

    request.flush(structureAnswer(network));

    expect(await listedNumbers()).toEqual(['EV-0002', 'NP-0001', 'NP-0003']);
    expect(mapIds()).toEqual([1, 2, 3]);
    expect(map().fitTo()).toEqual(network);
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
  });

  it('asks for what is in view once the map settles, and shows the answer on the map and in the list alike', async () => {
    await fixture.whenStable();
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
    await fixture.whenStable();
    networkRequest().flush(structureAnswer(network));

    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();
    const stale = viewRequest();
    map().viewChanged.emit(NEARBY_VIEW);
    await afterDebounce();

    expect(stale.cancelled).toBe(true);
    viewRequest().flush(structureAnswer([network[2]!]));
    expect(await listedNumbers()).toEqual(['EV-0002']);
  });

  it('ignores map moves made before the network has loaded', async () => {
    await fixture.whenStable();
    map().viewChanged.emit(KANSAS_VIEW);
    await afterDebounce();

    networkRequest().flush(structureAnswer(network));
    server.expectNone((r) => r.params.has('bbox'));
  });

  it('explains in the panel when the structures cannot be loaded', async () => {
    await fixture.whenStable();
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
    await fixture.whenStable();
    networkRequest().flush(structureAnswer(network));

    map().structureClicked.emit(3);
    await fixture.whenStable();
    const items = await (await loader.getHarness(MatActionListHarness)).getItems();
    expect(await (await items[0]!.host()).hasClass('selected-structure')).toBe(true);

    await items[2]!.click();
    expect(map().selectedId()).toBe(1);
  });
});
