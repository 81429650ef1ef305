import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MAX_STRUCTURES_PER_REQUEST } from '@spanledger/shared';
import { firstValueFrom } from 'rxjs';

import { NO_FILTERS } from './map-filters';
import { structureAnswer, structureFeature } from './structure-features.testing';
import { StructuresClient, bboxParameter } from './structures.client';

describe('StructuresClient', () => {
  let client: StructuresClient;
  let server: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    client = TestBed.inject(StructuresClient);
    server = TestBed.inject(HttpTestingController);
  });

  afterEach(() => server.verify());

  it('asks for the whole network with the largest page and no bbox', async () => {
    const answer = structureAnswer([structureFeature({ id: 1, structureNumber: 'NP-001' })]);
    const result = firstValueFrom(client.fetchNetwork());

    const request = server.expectOne((r) => r.url === 'api/structures');
    expect(request.request.method).toBe('GET');
    expect(request.request.params.keys()).toEqual(['limit']);
    expect(request.request.params.get('limit')).toBe(String(MAX_STRUCTURES_PER_REQUEST));
    request.flush(answer);

    expect(await result).toEqual(answer);
  });

  it('asks for a map view as a bbox rounded outward to 6 decimals', async () => {
    const result = firstValueFrom(
      client.fetchMatching(NO_FILTERS, { minLon: -98.12345678, minLat: 38.00000049, maxLon: -97.5, maxLat: 38.98765432 }),
    );

    const request = server.expectOne((r) => r.url === 'api/structures');
    expect(request.request.urlWithParams).toBe(
      `api/structures?bbox=-98.123457,38,-97.5,38.987655&limit=${MAX_STRUCTURES_PER_REQUEST}`,
    );
    request.flush(structureAnswer([]));
    await result;
  });

  it('sends the filters after the bbox, as the server reads them', async () => {
    const filters = { ...NO_FILTERS, districts: ['North Plains', 'East Valley'], statuses: ['posted' as const], conditionAtMost: 3, search: 'creek' };
    const result = firstValueFrom(client.fetchMatching(filters, { minLon: -100, minLat: 37.5, maxLon: -96.5, maxLat: 39.5 }));

    const request = server.expectOne((r) => r.url === 'api/structures');
    expect(request.request.urlWithParams).toBe(
      `api/structures?bbox=-100,37.5,-96.5,39.5&district=North%20Plains,East%20Valley&status=posted&conditionAtMost=3&search=creek&limit=${MAX_STRUCTURES_PER_REQUEST}`,
    );
    request.flush(structureAnswer([]));
    await result;
  });

  it('asks for the filtered network, with no bbox, before the map has a view', async () => {
    const result = firstValueFrom(client.fetchMatching({ ...NO_FILTERS, ratingBands: ['not-rated'] }, null));

    const request = server.expectOne((r) => r.url === 'api/structures');
    expect(request.request.urlWithParams).toBe(`api/structures?ratingBand=not-rated&ratingBasis=legal&limit=${MAX_STRUCTURES_PER_REQUEST}`);
    request.flush(structureAnswer([]));
    await result;
  });

  it('answers empty without asking when the view lies wholly beyond the antimeridian', async () => {
    const answer = await firstValueFrom(client.fetchMatching(NO_FILTERS, { minLon: 190, minLat: 10, maxLon: 250, maxLat: 40 }));

    server.expectNone(() => true);
    expect(answer.features).toEqual([]);
    expect(answer.truncated).toBe(false);
    expect(answer.total).toBe(0);
  });

  it('reads the district names for the filter', async () => {
    const result = firstValueFrom(client.fetchDistricts());

    const request = server.expectOne('api/districts');
    expect(request.request.method).toBe('GET');
    request.flush(['East Valley', 'North Plains']);

    expect(await result).toEqual(['East Valley', 'North Plains']);
  });
});

describe('bboxParameter', () => {
  it('clamps a zoomed-out view to the globe', () => {
    expect(bboxParameter({ minLon: -540.5, minLat: -95, maxLon: 300, maxLat: 91.2 })).toBe('-180,-90,180,90');
  });

  it('keeps a view that is already in range and round', () => {
    expect(bboxParameter({ minLon: -100, minLat: 37.5, maxLon: -96.5, maxLat: 39.5 })).toBe('-100,37.5,-96.5,39.5');
  });

  it('gives nothing when clamping leaves no latitude range', () => {
    expect(bboxParameter({ minLon: -100, minLat: 95, maxLon: -96, maxLat: 120 })).toBeNull();
  });
});
