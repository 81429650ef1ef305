import { runDataLoadOnce } from '../../backend/src/db/data-loads';
import { loadConfig } from '../../backend/src/config';
import { createLogger } from '../../backend/src/logger';
import { ObjectStorage } from '../../backend/src/photos/object-storage';
import { DEMO_DATA_LOAD, loadDemoPhotos, prepareDatabase } from '../../scripts/lib/local-database';
import { testObjectStorageEnv } from '../support/object-storage-settings';
import { testSignInEnv } from '../support/sign-in-settings';
import { DEMO_INSPECTED_STRUCTURES } from '../../seeds/demo-inspections';
import { DEMO_RATED_STRUCTURES, seed as seedDemoRatings } from '../../seeds/demo-ratings';
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

  describe('its rating records', () => {
    interface DemoRatingRow {
      id: number;
      structure_number: string;
      span_index: number;
      state: string;
      created_by: number;
      reviewed_by: number | null;
      lowest_legal_rf: number;
      lowest_inventory_rf: number;
      applied_findings: unknown[];
      review_comments: { step: string; comment: string }[];
    }
    const ratingRows = (): Promise<DemoRatingRow[]> =>
      testDb.db('ratings as r')
        .join('spans as sp', 'sp.id', 'r.span_id')
        .join('structures as s', 's.id', 'sp.structure_id')
        .select('r.id', 's.structure_number', 'sp.span_index', 'r.state', 'r.created_by', 'r.reviewed_by', 'r.lowest_legal_rf', 'r.lowest_inventory_rf', 'r.applied_findings', 'r.review_comments')
        .orderBy('r.id');

    let ratings: DemoRatingRow[];
    beforeAll(async () => {
      await prepareDatabase(testDb.db, { loadDemo: true });
      ratings = await ratingRows();
    }, 60_000);

    it('are in several states, on the planned structures', () => {
      const statesByStructure = new Map<string, Set<string>>();
      for (const rating of ratings) statesByStructure.set(rating.structure_number, (statesByStructure.get(rating.structure_number) ?? new Set()).add(rating.state));
      expect(new Map([...statesByStructure].map(([structure, states]) => [structure, [...states]]))).toEqual(new Map([...DEMO_RATED_STRUCTURES].map(([structure, state]) => [structure, [state]])));
      expect(new Set(ratings.map((rating) => rating.state))).toEqual(new Set(['approved', 'submitted', 'returned', 'draft']));
      const returned = ratings.find((rating) => rating.state === 'returned')!;
      expect(returned.review_comments.find((comment) => comment.step === 'returned')?.comment).toMatch(/\w{3}/);
    });

    it('are reviewed by someone other than the person who ran them', () => {
      const reviewed = ratings.filter((rating) => rating.state === 'approved' || rating.state === 'returned');
      expect(reviewed.length).toBeGreaterThan(0);
      for (const rating of reviewed) {
        expect(rating.reviewed_by).not.toBeNull();
        expect(rating.reviewed_by).not.toBe(rating.created_by);
      }
    });

    it('apply the damage on the register of every inspected structure', () => {
      for (const structureNumber of DEMO_INSPECTED_STRUCTURES) {
        const firstSpan = ratings.filter((rating) => rating.structure_number === structureNumber && rating.span_index === 1);
        expect(firstSpan.length).toBeGreaterThan(0);
        for (const rating of firstSpan) expect(rating.applied_findings.length).toBeGreaterThan(0);
      }
    });

    it('give every span of a structure with ratings of record one, and the structure the lowest of their factors for the map', async () => {
      const approved = ratings.filter((rating) => rating.state === 'approved');
      const structures = await testDb.db('structures').select('id', 'structure_number', 'rating_of_record_legal_rf', 'rating_of_record_inventory_rf', 'rating_of_record_approved_at');
      const withRecords = structures.filter((structure) => approved.some((rating) => rating.structure_number === structure.structure_number));
      expect(withRecords.length).toBeGreaterThanOrEqual(8);
      for (const structure of structures) {
        const records = approved.filter((rating) => rating.structure_number === structure.structure_number);
        if (records.length === 0) {
          expect(structure.rating_of_record_legal_rf).toBeNull();
          continue;
        }
        const spanCount = Number((await testDb.db('spans').where({ structure_id: structure.id }).count({ n: '*' }))[0]!.n);
        expect(records.map((rating) => rating.span_index).sort((a, b) => a - b)).toEqual(Array.from({ length: spanCount }, (_, index) => index + 1));
        expect(structure.rating_of_record_legal_rf).toBe(Math.min(...records.map((rating) => rating.lowest_legal_rf)));
        expect(structure.rating_of_record_inventory_rf).toBe(Math.min(...records.map((rating) => rating.lowest_inventory_rf)));
        expect(structure.rating_of_record_approved_at).not.toBeNull();
      }
    });

    it('leave every South District structure with no inspection unrated, for the journeys to rate', async () => {
      const uninspectedSouth = await testDb.db('structures')
        .where({ district: 'South District' })
        .whereNotExists(testDb.db('inspections').whereRaw('inspections.structure_id = structures.id'))
        .pluck('structure_number');
      expect(uninspectedSouth.length).toBeGreaterThan(0);
      expect(ratings.filter((rating) => uninspectedSouth.includes(rating.structure_number))).toEqual([]);
    });

    it('are not made twice: a structure that has ratings is passed over', async () => {
      await seedDemoRatings(testDb.db);
      expect((await ratingRows()).map((rating) => rating.id)).toEqual(ratings.map((rating) => rating.id));
    });
  });

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
