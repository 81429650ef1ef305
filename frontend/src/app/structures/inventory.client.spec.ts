import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';

import { HistoryClient } from './history.client';
import { InventoryClient } from './inventory.client';
import { girderSummary, spanDetail, structureDetail } from './inventory.testing';

describe('InventoryClient and HistoryClient', () => {
  let inventory: InventoryClient;
  let history: HistoryClient;
  let server: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    inventory = TestBed.inject(InventoryClient);
    history = TestBed.inject(HistoryClient);
    server = TestBed.inject(HttpTestingController);
  });

  afterEach(() => server.verify());

  it('reads a structure, its spans and a span’s girders', async () => {
    const structure = firstValueFrom(inventory.fetchStructure(41));
    server.expectOne({ method: 'GET', url: 'api/structures/41' }).flush(structureDetail());
    expect((await structure).structureNumber).toBe('NP-0041');

    const spans = firstValueFrom(inventory.fetchSpans(41));
    server.expectOne({ method: 'GET', url: 'api/structures/41/spans' }).flush([spanDetail()]);
    expect(await spans).toHaveLength(1);

    const girders = firstValueFrom(inventory.fetchGirders(301));
    server.expectOne({ method: 'GET', url: 'api/spans/301/girders' }).flush([girderSummary()]);
    expect((await girders)[0]!.strandCount).toBe(38);
  });

  it('sends changes as PATCH bodies with the version read', async () => {
    const structure = firstValueFrom(inventory.changeStructure(41, { version: 3, name: 'Willow Bend Bridge' }));
    const structureRequest = server.expectOne({ method: 'PATCH', url: 'api/structures/41' });
    expect(structureRequest.request.body).toEqual({ version: 3, name: 'Willow Bend Bridge' });
    structureRequest.flush(structureDetail({ version: 4 }));
    expect((await structure).version).toBe(4);

    const span = firstValueFrom(inventory.changeSpan(301, { version: 2, lengthM: 31 }));
    const spanRequest = server.expectOne({ method: 'PATCH', url: 'api/spans/301' });
    expect(spanRequest.request.body).toEqual({ version: 2, lengthM: 31 });
    spanRequest.flush(spanDetail({ lengthM: 31, version: 3 }));
    expect((await span).lengthM).toBe(31);
  });

  it('reads the districts and a page of history', async () => {
    const districts = firstValueFrom(inventory.fetchDistricts());
    server.expectOne({ method: 'GET', url: 'api/districts' }).flush(['North Plains']);
    expect(await districts).toEqual(['North Plains']);

    const page = firstValueFrom(history.fetchStructureHistory(41, { limit: 20, offset: 40 }));
    const request = server.expectOne((r) => r.url === 'api/structures/41/history');
    expect(request.request.urlWithParams).toBe('api/structures/41/history?limit=20&offset=40');
    request.flush({ items: [], total: 40, limit: 20, offset: 40 });
    expect((await page).total).toBe(40);
  });
});
