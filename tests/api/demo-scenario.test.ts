import { runDataLoadOnce } from '../../backend/src/db/data-loads';
import { loadConfig } from '../../backend/src/config';
import { createLogger } from '../../backend/src/logger';
import { ObjectStorage } from '../../backend/src/photos/object-storage';
import { DEMO_DATA_LOAD, loadDemoPhotos, prepareDatabase } from '../../scripts/lib/local-database';
import { testObjectStorageEnv } from '../support/object-storage-settings';
import { testSignInEnv } from '../support/sign-in-settings';
import { DEMO_INSPECTED_STRUCTURES } from '../../seeds/demo-inspections';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('the demo scenario', () => {
  let testDb: TestDatabase;
  beforeAll(async () => {
    testDb = await createTestDatabase();
  });
  afterAll(() => testDb.drop());

  const countStructures = async () => Number((await testDb.db('structures').count<{ count: string }[]>('* as count'))[0]?.count);

  it('loads once: a second start changes nothing', async () => {
    expect(await runDataLoadOnce(testDb.db, DEMO_DATA_LOAD, seedDemoStructures)).toBe(true);
    const first = await countStructures();
    expect(await runDataLoadOnce(testDb.db, DEMO_DATA_LOAD, seedDemoStructures)).toBe(false);
    expect(await countStructures()).toBe(first);
  });

  it('has at least 40 structures in three or four districts', async () => {
    expect(await countStructures()).toBeGreaterThanOrEqual(40);
    const districts = await testDb.db('structures').distinct('district');
    expect(districts.length).toBeGreaterThanOrEqual(3);
    expect(districts.length).toBeLessThanOrEqual(4);
  });

  it('places every structure inside one region of the basemap (the Kansas state outline)', async () => {
    // The outline of state FIPS 20 in us-atlas states-10m, the basemap the app ships.
    const atlas = require('us-atlas/states-10m.json');
    const { feature } = require('topojson-client');
    const kansas = feature(atlas, atlas.objects.states).features.find((state: { id: string }) => state.id === '20');
    const outside = await testDb.db('structures')
      .whereRaw('not ST_Contains(ST_SetSRID(ST_GeomFromGeoJSON(?), 4326), location)', [JSON.stringify(kansas.geometry)])
      .pluck('structure_number');
    expect(outside).toEqual([]);
  });

  it('holds an inspection history with damage on the register and one critical finding waiting for review', async () => {
    await prepareDatabase(testDb.db, { loadDemo: true });
    const inspections = await testDb.db('inspections').join('structures', 'structures.id', 'inspections.structure_id').select('structure_number', 'state').orderBy('structure_number');
    expect(inspections.map((i) => i.structure_number).sort()).toEqual([...DEMO_INSPECTED_STRUCTURES].sort());
    expect(inspections.filter((i) => i.state === 'submitted')).toHaveLength(1);
    const alerted = await testDb.db('alerts').join('users', 'users.id', 'alerts.user_id').distinct('users.display_name').pluck('display_name');
    expect(alerted).toEqual(['Tomasz Brenek']);
    // A second start loads nothing twice.
    await prepareDatabase(testDb.db, { loadDemo: true });
    expect(await testDb.db('inspections').count({ n: '*' })).toEqual([{ n: String(inspections.length) }]);
  }, 60_000);

  it('adds a drawn picture to each demo finding of damage, once, into the photo store', async () => {
    const storage = new ObjectStorage(loadConfig({ ...(await testSignInEnv(9)), ...(await testObjectStorageEnv()) }).objectStorage, createLogger('silent'));
    expect(await loadDemoPhotos(testDb.db, storage)).toBe(true);
    const photos = await testDb.db('photos').select('object_key', 'thumbnail_key', 'finding_id');
    const drawable = await testDb.db('findings').whereIn('kind', ['spall', 'lost-strands', 'strand-section-loss', 'crack']).count({ n: '*' });
    expect(photos).toHaveLength(Number(drawable[0]!.n));
    const stored = await storage.open(photos[0]!.thumbnail_key);
    stored.body.destroy();
    expect(await loadDemoPhotos(testDb.db, storage)).toBe(false);
  }, 60_000);

  it('leaves a failed load unrecorded so that it is tried again', async () => {
    await expect(runDataLoadOnce(testDb.db, 'broken-load', async () => Promise.reject(new Error('boom')))).rejects.toThrow('boom');
    expect(await testDb.db('data_loads').where({ name: 'broken-load' }).first()).toBeUndefined();
  });
});
