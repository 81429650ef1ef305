import type { GirderDetail, GirderRecordInput, HistoryEvent, Page } from '../../shared/src';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff: an inspector of North, a rater of Central, a rater of East and South. */
const STAFF = { inspector: 'bv-staff-1041', raterCentral: 'bv-staff-2013', raterEastSouth: 'bv-staff-2029' } as const;
type Staff = keyof typeof STAFF;

const RECORD_KEYS = ['position', 'girderTypeId', 'sectionOverrides', 'customSection', 'concrete', 'deckConcrete', 'strandRows', 'bars', 'tensioning', 'profiles', 'debonding', 'losses'] as const;

/** The editable record of a girder as the API answered it. */
const recordOf = (detail: GirderDetail): GirderRecordInput => Object.fromEntries(RECORD_KEYS.map((key) => [key, detail[key]])) as unknown as GirderRecordInput;

describe('girders API', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const clients = new Map<Staff, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    for (const staff of Object.keys(STAFF) as Staff[]) {
      const client = new SignInClient(bed.server.url);
      await client.signInAs(STAFF[staff]);
      clients.set(staff, client);
    }
  }, 60_000);
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  async function call<T = unknown>(staff: Staff, path: string, init: { method?: string; json?: unknown } = {}) {
    const response = await clients.get(staff)!.request(path, init);
    return { status: response.status, body: JSON.parse(response.text) as T & { error?: { code: string; details: { fields?: { field: string; message: string }[]; current?: unknown } } } };
  }
  const fieldsOf = (body: { error?: { details: { fields?: { field: string }[] } } }) => (body.error?.details.fields ?? []).map((f) => f.field);

  /** An interior girder of the first structure of a district. */
  async function girderIn(district: string): Promise<GirderDetail> {
    const { id } = await testDb.db('girders').join('spans', 'spans.id', 'girders.span_id').join('structures', 'structures.id', 'spans.structure_id')
      .where({ 'structures.district': district, 'girders.position': 'interior' }).orderBy(['structures.structure_number', 'spans.span_index', 'girders.girder_number']).first('girders.id');
    return (await call<GirderDetail>('inspector', `/api/girders/${id}`)).body;
  }
  const put = (staff: Staff, girder: GirderDetail, record: GirderRecordInput) => call<GirderDetail>(staff, `/api/girders/${girder.id}`, { method: 'PUT', json: { version: girder.version, ...record } });

  it('answers a girder with its type, strand rows and the section the engine will use', async () => {
    const girder = await girderIn('Central District');
    expect(girder).toMatchObject({ district: 'Central District', girderTypeName: expect.any(String), customSection: null, version: 1 });
    expect(girder.section).toMatchObject({ shape: expect.any(String), depthMm: expect.any(Number) });
    expect(girder.strandRows.length).toBeGreaterThan(0);
    expect((await call('inspector', '/api/girders/999999')).status).toBe(404);
  });

  it('takes the record back unchanged without a new version', async () => {
    const girder = await girderIn('Central District');
    const { status, body } = await put('raterCentral', girder, recordOf(girder));
    expect(status).toBe(200);
    expect(body.version).toBe(girder.version);
  });

  it('replaces the strand rows as a whole and keeps each changed part in the history', async () => {
    const girder = await girderIn('Central District');
    const record = recordOf(girder);
    const [first, ...rest] = girder.strandRows;
    const changed = { ...record, strandRows: [{ ...first!, count: first!.count - 2 }, ...rest.slice(1)], sectionOverrides: { depthMm: (girder.section.depthMm as number) + 50 } };
    const { status, body } = await put('raterCentral', girder, changed);
    expect(status).toBe(200);
    expect(body.version).toBe(girder.version + 1);
    expect(body.strandRows.map((row) => row.id)).toEqual([first!.id, ...rest.slice(1).map((row) => row.id)]);
    expect(body.section.depthMm).toBe((girder.section.depthMm as number) + 50);
    expect(await testDb.db('strand_rows').where({ girder_id: girder.id }).orderBy('row_order').pluck('row_key')).toEqual(body.strandRows.map((row) => row.id));

    const history = (await call<Page<HistoryEvent>>('inspector', `/api/structures/${girder.structureId}/history?limit=1`)).body;
    expect(history.items[0]).toMatchObject({ action: 'girder.changed', subject: `Span ${girder.spanIndex}, girder ${girder.girderNumber}`, userName: 'Priya Halloran' });
    expect(history.items[0]!.changes.map((c) => c.field).sort()).toEqual(['sectionOverrides', 'strandRows']);
  });

  it('names the place of each problem the engine finds, and writes nothing', async () => {
    const girder = await girderIn('South District');
    const record = recordOf(girder);
    const rows = girder.strandRows;
    const outside = await put('raterEastSouth', girder, { ...record, strandRows: [{ ...rows[0]!, yMm: 99_999 }, ...rows.slice(1)] });
    expect(outside.status).toBe(400);
    expect(fieldsOf(outside.body)).toContain('strandRows.0.yMm');

    const twice = await put('raterEastSouth', girder, { ...record, strandRows: [rows[0]!, { ...rows[0]! }] });
    expect(fieldsOf(twice.body)).toEqual(['strandRows.1.id']);
    const noType = await put('raterEastSouth', girder, { ...record, girderTypeId: 99_999 });
    expect(fieldsOf(noType.body)).toEqual(['girderTypeId']);
    const badOverride = await put('raterEastSouth', girder, { ...record, sectionOverrides: { colourMm: 3 } });
    expect(fieldsOf(badOverride.body)).toEqual(['sectionOverrides.colourMm']);
    const negative = await put('raterEastSouth', girder, { ...record, concrete: { ...girder.concrete, strengthMpa: -40 } });
    expect(fieldsOf(negative.body)).toEqual(['concrete.strengthMpa']);
    const profileOfNoRow = await put('raterEastSouth', girder, { ...record, profiles: [{ rowId: 'no-such-row', shape: 'straight' }] });
    expect(profileOfNoRow.status).toBe(400);
    expect(fieldsOf(profileOfNoRow.body)[0]).toMatch(/^profiles\.0/);

    expect(await testDb.db('girders').where({ id: girder.id }).first('version')).toEqual({ version: girder.version });
    expect(await testDb.db('audit_events').where({ entity_type: 'girder', entity_id: String(girder.id) }).count({ n: '*' })).toEqual([{ n: '0' }]);
  });

  it('refuses a stale version, other districts and other roles', async () => {
    const girder = await girderIn('East District');
    const record = recordOf(girder);
    expect((await put('inspector', girder, record)).status).toBe(403);
    expect((await put('raterCentral', girder, record)).status).toBe(403);
    const notAtEdge = await put('raterEastSouth', girder, { ...record, position: 'exterior' });
    expect(notAtEdge.body.error!.details.fields).toEqual([{ field: 'position', message: `girder ${girder.girderNumber} is not at an edge of the span` }]);
    expect((await put('raterEastSouth', girder, { ...record, concrete: { ...girder.concrete, elasticModulusMpa: 33_000 } })).status).toBe(200);
    const stale = await put('raterEastSouth', girder, { ...record, tensioning: 'pre', bars: [{ id: 'b1', yMm: 50, areaMm2: 400, fyMpa: 420 }] });
    expect(stale.status).toBe(409);
    expect(stale.body.error!.details.current).toMatchObject({ concrete: { elasticModulusMpa: 33_000 }, version: girder.version + 1 });
  });

  describe('girder types', () => {
    const newType = { name: 'Owner slab beam 450', section: { shape: 'rectangle', widthMm: 900, depthMm: 450 }, source: 'Authority standard drawing SB-450 (demo)' };

    it('lets a rater add a type, named once in any case, with its section checked', async () => {
      expect((await call('inspector', '/api/girder-types', { json: newType })).status).toBe(403);
      const added = await call<{ id: number; version: number; girderCount: number }>('raterCentral', '/api/girder-types', { json: newType });
      expect(added.status).toBe(201);
      expect(added.body).toMatchObject({ name: newType.name, shape: 'rectangle', depthMm: 450, girderCount: 0, version: 1 });
      const again = await call('raterEastSouth', '/api/girder-types', { json: { ...newType, name: newType.name.toUpperCase() } });
      expect(again.status).toBe(409);
      expect(fieldsOf(again.body)).toEqual(['name']);
      const bad = await call('raterCentral', '/api/girder-types', { json: { ...newType, name: 'Bad', section: { shape: 'rectangle', widthMm: -1, depthMm: 450 } } });
      expect(fieldsOf(bad.body)).toEqual(['section.widthMm']);
    });

    it('changes the section of a type in use only for someone who may change every district using it, and keeps its shape', async () => {
      const types = (await call<{ id: number; name: string; girderCount: number; version: number; section: Record<string, number | string> }[]>('inspector', '/api/girder-types')).body;
      const used = types.find((t) => t.girderCount > 0)!;
      const districts = await testDb.db('girders').join('spans', 'spans.id', 'girders.span_id').join('structures', 'structures.id', 'spans.structure_id').where('girders.girder_type_id', used.id).distinct('structures.district').pluck('district');
      expect(districts.length).toBeGreaterThan(1);
      const deeper = { ...used.section, depthMm: (used.section.depthMm as number) + 10 };
      const refused = await call<{ error: { message: string } }>('raterCentral', `/api/girder-types/${used.id}`, { method: 'PATCH', json: { version: used.version, section: deeper } });
      expect(refused.status).toBe(403);
      const renamed = await call<{ version: number }>('raterCentral', `/api/girder-types/${used.id}`, { method: 'PATCH', json: { version: used.version, source: `${used.name}: checked against the owner's copy (demo)` } });
      expect(renamed.status).toBe(200);
      expect(renamed.body.version).toBe(used.version + 1);
      const stale = await call('raterCentral', `/api/girder-types/${used.id}`, { method: 'PATCH', json: { version: used.version, source: 'x' } });
      expect(stale.status).toBe(409);
      const added = types.find((t) => t.name === newType.name)!;
      const reshaped = await call('raterCentral', `/api/girder-types/${added.id}`, { method: 'PATCH', json: { version: added.version, section: { shape: 'tee', flangeWidthMm: 900, flangeThicknessMm: 150, webWidthMm: 300, depthMm: 600 } } });
      expect(reshaped.status).toBe(200);
      expect((await call('inspector', '/api/girder-types/99999', { method: 'PATCH', json: { version: 1 } })).status).toBe(403);
      expect((await call('raterCentral', '/api/girder-types/99999', { method: 'PATCH', json: { version: 1 } })).status).toBe(404);
    });
  });
});
