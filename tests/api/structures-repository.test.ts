import { structureListQuery } from '../../shared/src';
import { findStructures } from '../../backend/src/structures/structures.repository';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

/** Points either side of each edge of one box, and one on its corner. Invented test data. */
const POINTS = [
  { structure_number: 'R-IN', lon: -98.0, lat: 38.0 },
  { structure_number: 'R-CORNER', lon: -97.5, lat: 38.5 },
  { structure_number: 'R-WEST', lon: -98.50001, lat: 38.0 },
  { structure_number: 'R-EAST', lon: -97.49999, lat: 38.0 },
  { structure_number: 'R-SOUTH', lon: -98.0, lat: 37.49999 },
  { structure_number: 'R-NORTH', lon: -98.0, lat: 38.50001 },
];

describe('findStructures with a bounding box', () => {
  let testDb: TestDatabase;
  beforeAll(async () => {
    testDb = await createTestDatabase();
    await testDb.db('structures').insert(
      POINTS.map(({ lon, lat, structure_number }) => ({
        structure_number,
        name: `${structure_number} bridge`,
        route_carried: 'Route 1',
        feature_crossed: 'Test Creek',
        district: 'Test',
        location: testDb.db.raw('ST_SetSRID(ST_MakePoint(?, ?), 4326)', [lon, lat]),
      })),
    );
  });
  afterAll(() => testDb.drop());

  it('counts every match past the page, also for a page beyond the end', async () => {
    const beyond = await findStructures(testDb.db, structureListQuery.parse({ offset: '10' }));
    expect(beyond).toEqual({ rows: [], total: POINTS.length });
    const firstTwo = await findStructures(testDb.db, structureListQuery.parse({ limit: '2' }));
    expect([firstTwo.rows.length, firstTwo.total]).toEqual([2, POINTS.length]);
  });

  it('keeps the points inside the box and on its edges, and none outside', async () => {
    const query = structureListQuery.parse({ bbox: '-98.5,37.5,-97.5,38.5' });
    const { rows, total } = await findStructures(testDb.db, query);
    expect(rows.map((row) => row.structure_number)).toEqual(['R-CORNER', 'R-IN']);
    expect(total).toBe(2);
    expect(rows[1]).toMatchObject({ longitude: -98, latitude: 38 });
  });

  it('can answer the box test (&&) from the spatial index', async () => {
    // Six rows would be read faster without the index; forbid plain scans inside one transaction to see that it can be used.
    const plan = await testDb.db.transaction(async (trx): Promise<{ rows: unknown[] }> => {
      await trx.raw('set local enable_seqscan = off');
      const sql = trx('structures').whereRaw('location && ST_MakeEnvelope(?, ?, ?, ?, 4326)', [-98.5, 37.5, -97.5, 38.5]).select('id').toString();
      return trx.raw(`explain ${sql}`);
    });
    expect(JSON.stringify(plan.rows)).toMatch(/structures_location_gist/);
  });
});
