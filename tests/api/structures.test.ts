import type { StructureFeatureCollection } from '../../shared/src';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Three structures far apart, so that a box can hold any one of them. Invented test data. */
const STRUCTURES = [
  { structure_number: 'T-001', name: 'West bridge', district: 'West', lon: -99.0, lat: 38.0 },
  { structure_number: 'T-002', name: 'Middle bridge', district: 'Middle', lon: -98.0, lat: 38.5 },
  { structure_number: 'T-003', name: 'East bridge', district: 'East', lon: -97.0, lat: 39.0 },
];

describe('GET /api/structures', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const inspector = () => new SignInClient(bed.server.url);
  let signedIn: SignInClient;

  /** GET as a signed-in inspector, with the JSON body parsed. */
  async function get(path: string, query: Record<string, string> = {}) {
    const search = new URLSearchParams(query).toString();
    const response = await signedIn.request(search ? `${path}?${search}` : path);
    return { status: response.status, headers: response.headers, body: JSON.parse(response.text) };
  }

  beforeAll(async () => {
    testDb = await createTestDatabase();
    bed = await startSignInTestBed(testDb.url);
    signedIn = inspector();
    await signedIn.signInAs('bv-staff-1041');
    await testDb.db('structures').insert(
      STRUCTURES.map(({ lon, lat, ...row }) => ({
        ...row,
        route_carried: 'Route 1',
        feature_crossed: 'Test Creek',
        year_built: 1975,
        adt: 1200,
        adtt: 120,
        location: testDb.db.raw('ST_SetSRID(ST_MakePoint(?, ?), 4326)', [lon, lat]),
      })),
    );
  });
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  const numbersOf = (body: StructureFeatureCollection) => body.features.map((f) => f.properties.structureNumber);

  it('returns every structure as a GeoJSON FeatureCollection in structure-number order', async () => {
    const response = await get('/api/structures');
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toMatch(/application\/geo\+json/);
    const body = response.body as StructureFeatureCollection;
    expect(body.type).toBe('FeatureCollection');
    expect(body.truncated).toBe(false);
    expect(numbersOf(body)).toEqual(['T-001', 'T-002', 'T-003']);
    expect(body.features[0]).toEqual({
      type: 'Feature',
      id: expect.any(Number),
      geometry: { type: 'Point', coordinates: [-99, 38] },
      properties: {
        id: body.features[0]?.id,
        structureNumber: 'T-001',
        name: 'West bridge',
        routeCarried: 'Route 1',
        featureCrossed: 'Test Creek',
        district: 'West',
        yearBuilt: 1975,
        adt: 1200,
        adtt: 120,
        status: 'open',
        lowestCondition: null,
        legalRatingFactor: null,
        designInventoryRatingFactor: null,
        reratingDue: false,
      },
    });
  });

  it('keeps only the structures inside the bounding box', async () => {
    const response = await get('/api/structures', { bbox: '-98.5,38.2,-97.5,38.8' });
    expect(response.status).toBe(200);
    expect(numbersOf(response.body)).toEqual(['T-002']);
  });

  it('returns an empty collection for a box with nothing in it', async () => {
    const response = await get('/api/structures', { bbox: '10,10,11,11' });
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ type: 'FeatureCollection', total: 0, truncated: false, features: [] });
  });

  it('cuts the list at the limit and says so', async () => {
    const response = await get('/api/structures', { limit: '2' });
    expect(response.status).toBe(200);
    expect(numbersOf(response.body)).toEqual(['T-001', 'T-002']);
    expect(response.body.truncated).toBe(true);
    expect(response.body.total).toBe(3);
  });

  it.each([
    ['bbox', '1,2,3', /bbox: expected four numbers/],
    ['bbox', '1,2,x,4', /bbox: expected four numbers/],
    ['bbox', '-98,38,-99,39', /bbox: minLon must be less than maxLon/],
    ['bbox', '-98,95,-97,96', /bbox: latitudes must lie between -90 and 90/],
    ['limit', 'ten', /limit: expected a whole number/],
    ['limit', '0', /limit: .*>=\s*1/],
    ['limit', '20001', /limit: .*<=\s*20000/],
  ])('answers 400 naming %s when it is %p', async (parameter, value, message) => {
    const response = await get('/api/structures', { [parameter]: value });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation_failed');
    expect(response.body.error.message).toMatch(message);
    expect(response.body.error.details.fields).toEqual([{ field: parameter, message: expect.any(String) }]);
  });

  it('answers 401 to a visitor who has not signed in', async () => {
    const response = await inspector().request('/api/structures');
    expect(response.status).toBe(401);
    expect(JSON.parse(response.text).error.code).toBe('sign_in_required');
  });

  it('answers 400 for a parameter it does not know', async () => {
    const response = await get('/api/structures', { box: '1,2,3,4' });
    expect(response.status).toBe(400);
    expect(response.body.error.details.fields).toEqual([{ field: 'box', message: 'unknown query parameter' }]);
  });
});
