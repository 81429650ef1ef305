import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MAX_STRUCTURES_PER_REQUEST } from '@spanledger/shared';
import { firstValueFrom } from 'rxjs';

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
      client.fetchInBox({ minLon: -98.12345678, minLat: 38.00000049, maxLon: -97.5, maxLat: 38.98765432 }),
    );

    const request = server.expectOne((r) => r.url === 'api/structures');
    expect(request.request.urlWithParams).toBe(
      `api/structures?bbox=-98.123457,38,-97.5,38.987655&limit=${MAX_STRUCTURES_PER_REQUEST}`,
    );
    request.flush(structureAnswer([]));
    await result;
  });

  it('answers empty without asking when the view lies wholly beyond the antimeridian', async () => {
    const answer = await firstValueFrom(client.fetchInBox({ minLon: 190, minLat: 10, maxLon: 250, maxLat: 40 }));

    server.expectNone(() => true);
    expect(answer.features).toEqual([]);
    expect(answer.truncated).toBe(false);
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
