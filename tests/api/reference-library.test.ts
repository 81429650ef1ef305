import { POLICY_LIBRARY, VEHICLE_LIBRARY, type LibraryItemSummary } from '../../shared/src';
import { syncReferenceLibrary } from '../../backend/src/library/reference-library';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

describe('vehicle library and rating policies', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const admin = () => signedIn.get('bv-staff-3002')!;
  const rater = () => signedIn.get('bv-staff-2013')!;
  const signedIn = new Map<string, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await syncReferenceLibrary(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    for (const subject of ['bv-staff-3002', 'bv-staff-2013']) {
      const client = new SignInClient(bed.server.url);
      await client.signInAs(subject);
      signedIn.set(subject, client);
    }
  });
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  const list = async (path: string) => JSON.parse((await rater().request(path)).text) as LibraryItemSummary[];

  it('holds every vehicle and policy of the engine at version 1, each with its source', async () => {
    const vehicles = await list('/api/vehicles');
    expect(vehicles.map((v) => v.id).sort()).toEqual([...VEHICLE_LIBRARY.keys()].sort());
    expect(vehicles.every((v) => v.version === '1' && v.source.length > 0)).toBe(true);
    const policies = await list('/api/rating-policies');
    expect(policies.map((p) => `${p.id}@${p.version}`)).toEqual(Object.values(POLICY_LIBRARY).map((p) => `${p.id}@${p.version}`));
  });

  it('adds nothing when synchronised again, and a new version when a vehicle changed', async () => {
    await syncReferenceLibrary(testDb.db);
    expect(await testDb.db('vehicles').count({ n: '*' })).toEqual([{ n: String(VEHICLE_LIBRARY.size) }]);
    const [first] = VEHICLE_LIBRARY.values();
    await testDb.db('vehicles').where({ id: first!.id, version: '1' }).update({ definition: JSON.stringify({ ...first, name: 'edited by hand' }) });
    await syncReferenceLibrary(testDb.db);
    expect(await testDb.db('vehicles').where({ id: first!.id }).orderBy('version').pluck('version')).toEqual(['1', '2']);
  });

  it('lets an administrator add a vehicle version, and no one else', async () => {
    const vehicle = { ...VEHICLE_LIBRARY.get('type-3')!, name: 'Type 3 with a heavier rear tandem (owner policy)' };
    expect((await rater().request('/api/vehicles', { json: vehicle })).status).toBe(403);
    const added = await admin().request('/api/vehicles', { json: vehicle });
    expect(added.status).toBe(201);
    expect(JSON.parse(added.text)).toMatchObject({ id: 'type-3', version: '2', name: vehicle.name });
    const history = await testDb.db('audit_events').where({ entity_type: 'vehicle', entity_id: 'type-3@2' }).first('action');
    expect(history).toEqual({ action: 'vehicle.added' });
  });

  it('names the bad field of a vehicle and refuses a policy version that exists', async () => {
    const bad = await admin().request('/api/vehicles', { json: { ...VEHICLE_LIBRARY.get('type-3')!, weightKn: -5 } });
    expect(bad.status).toBe(400);
    expect(JSON.parse(bad.text).error.details.fields.map((f: { field: string }) => f.field)).toContain('weightKn');
    const again = await admin().request('/api/rating-policies', { json: POLICY_LIBRARY['lrfr-default'] });
    expect(again.status).toBe(409);
    expect(JSON.parse(again.text).error.details.fields).toEqual([{ field: 'version', message: expect.stringMatching(/already exists/) }]);
  });
});
