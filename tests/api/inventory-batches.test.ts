import type { NewStructure, SignedInUser } from '../../shared/src';
import { toGirderRecord } from '../../backend/src/girders/girder-record';
import { findGirdersOfSpans, findStrandRows } from '../../backend/src/girders/girders.repository';
import { createGirders } from '../../backend/src/girders/girders.service';
import { createSpans, type NewSpanFields } from '../../backend/src/spans/spans.service';
import { createStructures } from '../../backend/src/structures/structures.service';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

/**
 * The services' "many at once" paths, which imports use: the same rules as one record through
 * the API, each refusal named by the item's index, the accepted items written with a history
 * entry each. Invented test data inside the fictional demo authority.
 */
describe('adding many inventory records at once', () => {
  let testDb: TestDatabase;
  let rater: SignedInUser;

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    const [user] = await testDb.db('users')
      .insert({ subject: 'batch-rater', email: 'batch.rater@example.test', display_name: 'Batch Rater', role: 'rater', districts: ['Central District'], last_signed_in_at: testDb.db.fn.now() })
      .returning('id');
    rater = { id: (user as { id: number }).id, email: 'batch.rater@example.test', displayName: 'Batch Rater', role: 'rater', districts: ['Central District'], admin: false };
  }, 60_000);
  afterAll(() => testDb.drop());

  const structure = (structureNumber: string, district = 'Central District'): NewStructure =>
    ({ structureNumber, name: `${structureNumber} bridge`, routeCarried: 'Route 9', featureCrossed: 'Batch Creek', district, longitude: -97.6, latitude: 38.4, status: 'open' }) as NewStructure;

  const eventsOf = async (action: string, ids: readonly (number | null)[]) =>
    testDb.db('audit_events').where({ action }).whereIn('entity_id', ids.filter((id) => id !== null).map(String)).count<{ count: string }[]>('* as count');

  it('adds structures, refusing by index one in a district the user may not change and one whose number is taken', async () => {
    const [taken] = await testDb.db('structures').where({ district: 'Central District' }).select('structure_number');
    const created = await createStructures({ db: testDb.db, user: rater }, [structure('BV-B-0001'), structure('BV-B-0002', 'South District'), structure(taken!.structure_number), structure('BV-B-0003')]);
    expect(created.ids.map((id) => id !== null)).toEqual([true, false, false, true]);
    expect(created.refused.get(1)!.message).toMatch(/South District/);
    expect(created.refused.get(2)!.message).toMatch(/already in the register/);
    expect(await eventsOf('structure.created', created.ids)).toEqual([{ count: '2' }]);
  });

  it('adds spans and girders in one go, each span due for a rating, refusing a girder whose section the engine rejects', async () => {
    const [structureId] = (await createStructures({ db: testDb.db, user: rater }, [structure('BV-B-0010')])).ids;
    const [sample] = await testDb.db({ sp: 'spans' }).join({ s: 'structures' }, 's.id', 'sp.structure_id').where('s.district', 'Central District').select('sp.*');
    const fields: NewSpanFields = {
      lengthM: sample.length_m,
      girderSpacingMm: sample.girder_spacing_mm,
      overhangMm: sample.overhang_mm,
      roadwayWidthMm: sample.roadway_width_mm,
      barrierFaceToGirderMm: sample.barrier_face_to_girder_mm,
      deckThicknessMm: sample.deck_thickness_mm,
      haunchMm: sample.haunch_mm,
      wearingSurface: null,
      barriers: [],
      diaphragms: [{ xM: sample.length_m + 1 }] as NewSpanFields['diaphragms'],
    };
    const spans = await createSpans({ db: testDb.db, user: rater }, [
      { structureId: structureId!, spanIndex: 1, fields: { ...fields, diaphragms: [] }, girderCount: 3 },
      { structureId: structureId!, spanIndex: 2, fields, girderCount: 2 },
    ]);
    expect(spans.ids[1]).toBeNull();
    expect(spans.refused.get(1)!.details).toMatchObject({ fields: [{ field: 'diaphragms.0.xM' }] });
    const spanId = spans.ids[0]!;
    expect((await testDb.db('spans').where({ id: spanId }).first('rerating_due_since')).rerating_due_since).not.toBeNull();

    const [stored] = await findGirdersOfSpans(testDb.db, [sample.id]);
    const record = toGirderRecord(stored!, await findStrandRows(testDb.db, stored!.id));
    const girders = await createGirders({ db: testDb.db, user: rater }, [
      { spanId, girderNumber: 1, record: { ...record, position: 'exterior' } },
      { spanId, girderNumber: 2, record: { ...record, position: 'interior', strandRows: record.strandRows.map((row) => ({ ...row, yMm: -500 })) } },
      { spanId, girderNumber: 3, record: { ...record, position: 'exterior' } },
    ]);
    expect(girders.ids.map((id) => id !== null)).toEqual([true, false, true]);
    expect((girders.refused.get(1)!.details as { fields: { field: string }[] }).fields.map((problem) => problem.field)).toEqual(record.strandRows.map((_, index) => `strandRows.${index}.yMm`));
    const written = await findGirdersOfSpans(testDb.db, [spanId]);
    expect(written.map((girder) => girder.girder_number)).toEqual([1, 3]);
    expect((await findStrandRows(testDb.db, written[1]!.id)).map((row) => row.row_key)).toEqual(record.strandRows.map((row) => row.id));
    expect(await eventsOf('girder.created', girders.ids)).toEqual([{ count: '2' }]);
  });
});
