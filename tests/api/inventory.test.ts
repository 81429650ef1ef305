import type { GirderSummary, HistoryEvent, Page, SpanDetail, StructureDetail, StructureFeatureCollection } from '../../shared/src';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff (scripts/lib/local-identity-provider/demo-users.ts) and the districts they may change. */
const STAFF = {
  inspectorNorth: 'bv-staff-1041',
  raterCentral: 'bv-staff-2013',
  raterEastSouth: 'bv-staff-2029',
  managerWholeNetwork: 'bv-staff-3002',
  managerNorthCentral: 'bv-staff-3018',
} as const;
type Staff = keyof typeof STAFF;

describe('inventory API', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const clients = new Map<Staff, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    await seedDemoConditions(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    for (const staff of Object.keys(STAFF) as Staff[]) {
      const client = new SignInClient(bed.server.url);
      await client.signInAs(STAFF[staff]);
      clients.set(staff, client);
    }
    // The demo inventory is some eight hundred girders; loading it takes a few seconds on a busy machine.
  }, 60_000);
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  async function call<T = unknown>(staff: Staff, path: string, init: { method?: string; json?: unknown } = {}) {
    const response = await clients.get(staff)!.request(path, init);
    return { status: response.status, body: JSON.parse(response.text) as T & { error?: { code: string; message: string; details: { fields?: { field: string; message: string }[]; current?: unknown } } } };
  }
  const fieldsOf = (body: { error?: { details: { fields?: { field: string }[] } } }) => (body.error?.details.fields ?? []).map((f) => f.field);

  /** A structure of the demo in the given district, read fresh. */
  async function structureIn(district: string): Promise<StructureDetail> {
    const { id } = await testDb.db('structures').where({ district }).orderBy('structure_number').first('id');
    return (await call<StructureDetail>('managerWholeNetwork', `/api/structures/${id}`)).body;
  }

  describe('GET /api/structures', () => {
    const numbers = (body: StructureFeatureCollection) => body.features.map((f) => f.properties.structureNumber);

    it('filters by district and status, and counts every match', async () => {
      const { status, body } = await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?district=North%20District&status=open');
      expect(status).toBe(200);
      const expected = await testDb.db('structures').where({ district: 'North District', status: 'open' }).orderBy('structure_number').pluck('structure_number');
      expect(expected.length).toBeGreaterThan(3);
      expect(numbers(body)).toEqual(expected);
      expect(body.total).toBe(expected.length);
      expect(body.features.every((f) => f.properties.district === 'North District' && f.properties.status === 'open')).toBe(true);
    });

    it('searches the number or the name in any case, with % taken literally', async () => {
      const { body } = await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?search=owl%20creek');
      expect(body.total).toBe(4);
      expect(body.features.every((f) => f.properties.name.startsWith('Owl Creek Bridge'))).toBe(true);
      expect((await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?search=%25')).body.total).toBe(0);
      expect((await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?search=bv-e-01')).body.total).toBeGreaterThan(0);
    });

    it('filters by the lowest condition rating', async () => {
      const { body } = await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?conditionAtMost=4');
      const expected = await testDb.db('structures').whereRaw('least(deck_condition, superstructure_condition, substructure_condition) <= 4').count({ n: '*' });
      expect(body.total).toBe(Number(expected[0]!.n));
      expect(body.total).toBeGreaterThan(0);
      expect(body.features.every((f) => f.properties.lowestCondition! <= 4)).toBe(true);
    });

    it('puts unrated structures in the "not rated" band and rated ones in theirs, by the basis asked for', async () => {
      const all = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?ratingBand=not-rated')).body.total;
      expect(all).toBe(48);
      const [one, two] = await testDb.db('structures').orderBy('structure_number').limit(2).pluck('id');
      await testDb.db('structures').where({ id: one }).update({ rating_of_record_legal_rf: 0.92, rating_of_record_inventory_rf: 1.1, rating_of_record_approved_at: testDb.db.fn.now() });
      await testDb.db('structures').where({ id: two }).update({ rating_of_record_legal_rf: 1.6, rating_of_record_inventory_rf: 0.95, rating_of_record_approved_at: testDb.db.fn.now() });
      try {
        const legalBelowOne = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?ratingBand=below-1')).body;
        expect(legalBelowOne.features.map((f) => f.id)).toEqual([one]);
        expect(legalBelowOne.features[0]!.properties.legalRatingFactor).toBe(0.92);
        const inventoryBelowOne = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?ratingBand=below-1&ratingBasis=design-inventory')).body;
        expect(inventoryBelowOne.features.map((f) => f.id)).toEqual([two]);
        const twoBands = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?ratingBand=below-1,1.5-up&sort=-ratingFactor')).body;
        expect(twoBands.features.map((f) => f.id)).toEqual([two, one]);
      } finally {
        await testDb.db('structures').whereIn('id', [one, two]).update({ rating_of_record_legal_rf: null, rating_of_record_inventory_rf: null, rating_of_record_approved_at: null });
      }
    });

    it('sorts and pages, saying when the page holds fewer than match', async () => {
      const first = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?sort=-adt&limit=5')).body;
      const second = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?sort=-adt&limit=5&offset=5')).body;
      const adts = [...first.features, ...second.features].map((f) => f.properties.adt!);
      expect(adts).toEqual([...adts].sort((a, b) => b - a));
      expect(first.truncated).toBe(true);
      expect(first.total).toBe(48);
      const last = (await call<StructureFeatureCollection>('inspectorNorth', '/api/structures?limit=5&offset=45')).body;
      expect(last.features).toHaveLength(3);
      expect(last.truncated).toBe(false);
    });

    it('names each bad parameter', async () => {
      const { status, body } = await call('inspectorNorth', '/api/structures?status=shut&sort=colour&offset=-1');
      expect(status).toBe(400);
      expect(fieldsOf(body).sort()).toEqual(['offset', 'sort', 'status']);
    });

    it('lists the districts for the filter', async () => {
      expect((await call('inspectorNorth', '/api/districts')).body).toEqual(['Central District', 'East District', 'North District', 'South District']);
    });
  });

  describe('GET /api/structures/:id', () => {
    it('answers the structure with its condition, spans and stamps', async () => {
      const structure = await structureIn('South District');
      expect(structure).toMatchObject({ district: 'South District', ratingOfRecord: null, version: 1, created: { by: null } });
      expect(structure.conditions.superstructure).toEqual(expect.any(Number));
      expect(structure.conditions.ratedOn).toMatch(/^2026-\d\d-\d\d$/);
      expect(structure.spans.length).toBeGreaterThanOrEqual(2);
      expect(structure.spans.map((s) => s.spanIndex)).toEqual(structure.spans.map((_, i) => i + 1));
    });

    it('answers 404 for an id that does not exist and 400 for one that is not a number', async () => {
      expect((await call('inspectorNorth', '/api/structures/999999')).status).toBe(404);
      const bad = await call('inspectorNorth', '/api/structures/abc');
      expect(bad.status).toBe(400);
      expect(fieldsOf(bad.body)).toEqual(['id']);
    });
  });

  describe('PATCH /api/structures/:id', () => {
    it('lets a rater change a structure of their district, and keeps the change in the history', async () => {
      const structure = await structureIn('Central District');
      const rating = structure.conditions.superstructure === 5 ? 4 : 5;
      const { status, body } = await call<StructureDetail>('raterCentral', `/api/structures/${structure.id}`, {
        method: 'PATCH',
        json: { version: structure.version, notes: 'Bearing pads bulging at pier 1', superstructureCondition: rating, name: structure.name },
      });
      expect(status).toBe(200);
      expect(body).toMatchObject({ version: structure.version + 1, notes: 'Bearing pads bulging at pier 1', conditions: { superstructure: rating }, updated: { by: 'Priya Halloran' } });

      const history = (await call<Page<HistoryEvent>>('inspectorNorth', `/api/structures/${structure.id}/history`)).body;
      expect(history.total).toBe(1);
      expect(history.items[0]).toMatchObject({ action: 'structure.changed', subject: 'Structure', userName: 'Priya Halloran' });
      expect(history.items[0]!.changes).toEqual(
        expect.arrayContaining([
          { field: 'notes', before: '', after: 'Bearing pads bulging at pier 1' },
          { field: 'superstructureCondition', before: structure.conditions.superstructure, after: rating },
        ]),
      );
      // The name was sent unchanged, so the history does not list it.
      expect(history.items[0]!.changes.map((c) => c.field)).not.toContain('name');
    });

    it('refuses a stale version with 409 and the current record, and writes nothing', async () => {
      const structure = await structureIn('East District');
      const first = await call('raterEastSouth', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, adt: 5000, adtt: 400 } });
      expect(first.status).toBe(200);
      const stale = await call<StructureDetail>('managerWholeNetwork', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, adt: 9000 } });
      expect(stale.status).toBe(409);
      expect(stale.body.error!.code).toBe('version_conflict');
      expect(stale.body.error!.details.current).toMatchObject({ adt: 5000, version: structure.version + 1 });
      const row = await testDb.db('structures').where({ id: structure.id }).first('adt', 'version');
      expect(row).toEqual({ adt: 5000, version: structure.version + 1 });
    });

    it('limits changes to the user’s districts and roles', async () => {
      const north = await structureIn('North District');
      const change = { method: 'PATCH', json: { version: north.version, notes: 'x' } };
      expect((await call('inspectorNorth', `/api/structures/${north.id}`, change)).status).toBe(403);
      const outside = await call('raterCentral', `/api/structures/${north.id}`, change);
      expect(outside.status).toBe(403);
      expect(outside.body.error!.message).toMatch(/North District/);
      // A manager of North and Central may not move a structure into a district outside them.
      const move = await call('managerNorthCentral', `/api/structures/${north.id}`, { method: 'PATCH', json: { version: north.version, district: 'East District' } });
      expect(move.status).toBe(403);
      expect((await testDb.db('structures').where({ id: north.id }).first('version')).version).toBe(north.version);
      expect(await testDb.db('audit_events').where({ entity_type: 'structure', entity_id: String(north.id) }).count({ n: '*' })).toEqual([{ n: '0' }]);
      expect((await call('managerNorthCentral', `/api/structures/${north.id}`, change)).status).toBe(200);
    });

    it('names each bad field, including a rule against a value already stored', async () => {
      const structure = await structureIn('South District');
      const bad = await call('managerWholeNetwork', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, deckCondition: 12, status: 'shut', colour: 'red' } });
      expect(bad.status).toBe(400);
      expect(fieldsOf(bad.body).sort()).toEqual(['colour', 'deckCondition', 'status']);
      const againstStored = await call('managerWholeNetwork', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, adtt: structure.adt! + 1 } });
      expect(againstStored.status).toBe(400);
      expect(fieldsOf(againstStored.body)).toEqual(['adtt']);
    });

    it('leaves open, posted or closed to managers, who decide postings', async () => {
      const structure = await structureIn('Central District');
      const target = structure.status === 'posted' ? 'open' : 'posted';
      const byRater = await call('raterCentral', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, status: target } });
      expect(byRater.status).toBe(403);
      expect(byRater.body.error!.message).toMatch(/asset manager/);
      expect((await call('raterCentral', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, status: structure.status } })).status).toBe(200);
      const byManager = await call<StructureDetail>('managerNorthCentral', `/api/structures/${structure.id}`, { method: 'PATCH', json: { version: structure.version, status: target } });
      expect(byManager.status).toBe(200);
      expect(byManager.body.status).toBe(target);
    });

    it('refuses a structure number another structure has', async () => {
      const [a, b] = await testDb.db('structures').where({ district: 'South District' }).orderBy('structure_number').limit(2).select('id', 'structure_number', 'version');
      const { status, body } = await call('raterEastSouth', `/api/structures/${a.id}`, { method: 'PATCH', json: { version: a.version, structureNumber: b.structure_number } });
      expect(status).toBe(409);
      expect(fieldsOf(body)).toEqual(['structureNumber']);
    });
  });

  describe('POST /api/structures', () => {
    const newOne = { structureNumber: 'BV-C-9001', name: 'Test Draw Bridge near Marden', routeCarried: 'Route 4', featureCrossed: 'Test Draw', district: 'Central District', longitude: -98.6, latitude: 38.5, yearBuilt: 2025 };

    it('adds a structure in the user’s district and records it', async () => {
      const { status, body } = await call<StructureDetail>('raterCentral', '/api/structures', { json: newOne });
      expect(status).toBe(201);
      expect(body).toMatchObject({ structureNumber: 'BV-C-9001', status: 'open', version: 1, spans: [], created: { by: 'Priya Halloran' } });
      expect(body.longitude).toBeCloseTo(-98.6, 9);
      const history = (await call<Page<HistoryEvent>>('raterCentral', `/api/structures/${body.id}/history`)).body;
      expect(history.items.map((e) => e.action)).toEqual(['structure.created']);
    });

    it('refuses a number already in the register, another district, and missing fields', async () => {
      expect((await call('raterCentral', '/api/structures', { json: newOne })).status).toBe(409);
      expect((await call('raterCentral', '/api/structures', { json: { ...newOne, structureNumber: 'BV-E-9002', district: 'East District' } })).status).toBe(403);
      const missing = await call('raterCentral', '/api/structures', { json: { structureNumber: 'BV-C-9003' } });
      expect(missing.status).toBe(400);
      expect(fieldsOf(missing.body)).toEqual(expect.arrayContaining(['name', 'district', 'longitude', 'latitude']));
    });
  });

  describe('spans', () => {
    it('lists a structure’s spans and changes one, in the structure’s history as "Span n"', async () => {
      const structure = await structureIn('Central District');
      const spans = (await call<SpanDetail[]>('inspectorNorth', `/api/structures/${structure.id}/spans`)).body;
      expect(spans.map((s) => s.spanIndex)).toEqual(structure.spans.map((s) => s.spanIndex));
      const span = spans[1]!;
      const { status, body } = await call<SpanDetail>('raterCentral', `/api/spans/${span.id}`, {
        method: 'PATCH',
        json: { version: span.version, wearingSurface: { thicknessMm: 50, measured: true, kind: 'overlay' }, barriers: [{ loadKnM: 8.25 }, { loadKnM: 8.25 }] },
      });
      expect(status).toBe(200);
      expect(body).toMatchObject({ version: span.version + 1, wearingSurface: { thicknessMm: 50 }, barriers: [{ loadKnM: 8.25 }, { loadKnM: 8.25 }], updated: { by: 'Priya Halloran' } });
      expect((await call<SpanDetail>('inspectorNorth', `/api/spans/${span.id}`)).body).toEqual(body);

      const history = (await call<Page<HistoryEvent>>('inspectorNorth', `/api/structures/${structure.id}/history?limit=1`)).body;
      expect(history.items[0]).toMatchObject({ action: 'span.changed', subject: `Span ${span.spanIndex}`, userName: 'Priya Halloran' });
      expect(history.items[0]!.changes.map((c) => c.field).sort()).toEqual(['barriers', 'wearingSurface']);
    });

    it('refuses a stale version, a span outside the user’s districts, a diaphragm off the span and an unknown span', async () => {
      const structure = await structureIn('South District');
      const span = (await call<SpanDetail>('inspectorNorth', `/api/spans/${structure.spans[0]!.id}`)).body;
      expect((await call('raterCentral', `/api/spans/${span.id}`, { method: 'PATCH', json: { version: span.version, haunchMm: 40 } })).status).toBe(403);
      const offSpan = await call('raterEastSouth', `/api/spans/${span.id}`, { method: 'PATCH', json: { version: span.version, diaphragms: [{ xM: span.lengthM + 1, loadKn: 10 }] } });
      expect(offSpan.status).toBe(400);
      expect(fieldsOf(offSpan.body)).toEqual(['diaphragms.0.xM']);
      expect((await call('raterEastSouth', `/api/spans/${span.id}`, { method: 'PATCH', json: { version: span.version, haunchMm: 40 } })).status).toBe(200);
      const stale = await call('raterEastSouth', `/api/spans/${span.id}`, { method: 'PATCH', json: { version: span.version, haunchMm: 60 } });
      expect(stale.status).toBe(409);
      expect(stale.body.error!.details.current).toMatchObject({ haunchMm: 40 });
      expect((await call('inspectorNorth', '/api/spans/999999')).status).toBe(404);
    });
  });

  describe('girders, girder types and the reference library', () => {
    it('lists a span’s girders with the strands each holds', async () => {
      const structure = await structureIn('East District');
      const spanId = structure.spans[0]!.id;
      const girders = (await call<GirderSummary[]>('inspectorNorth', `/api/spans/${spanId}/girders`)).body;
      const stored: { girder_number: number; strands: string }[] = await testDb.db
        .raw('select g.girder_number, sum(r.strand_count) as strands from strand_rows r join girders g on g.id = r.girder_id where g.span_id = ? group by g.girder_number order by g.girder_number', [spanId])
        .then((result: { rows: { girder_number: number; strands: string }[] }) => result.rows);
      expect(girders.map((g) => [g.girderNumber, g.strandCount])).toEqual(stored.map((row) => [row.girder_number, Number(row.strands)]));
      expect(girders[0]).toMatchObject({ position: 'exterior', girderTypeName: expect.any(String), concreteStrengthMpa: expect.any(Number), tensioning: 'pre' });
      expect((await call('inspectorNorth', '/api/spans/999999/girders')).status).toBe(404);
    });

    it('lists the girder-type catalogue with each row’s source', async () => {
      const types = (await call<{ name: string; source: string; shape: string }[]>('inspectorNorth', '/api/girder-types')).body;
      expect(types.length).toBeGreaterThanOrEqual(7);
      expect(types.every((t) => t.source.length > 0 && t.shape.length > 0)).toBe(true);
    });
  });
});
