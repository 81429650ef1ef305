import { parseRateFile, rateGirderLine } from '../../shared/src';
import { girderCalcFileParts, type StoredGirder, type StoredSpan } from '../../backend/src/girders/girder-calc-file';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('every stored girder exports to a calculation file the engine accepts', () => {
  let testDb: TestDatabase;
  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    await seedDemoConditions(testDb.db);
  }, 60_000);
  afterAll(() => testDb.drop());

  async function rateFilesOfAllGirders() {
    const db = testDb.db;
    const girders = await db('girders')
      .join('spans', 'spans.id', 'girders.span_id')
      .join('structures', 'structures.id', 'spans.structure_id')
      .leftJoin('girder_types', 'girder_types.id', 'girders.girder_type_id')
      .select('girders.*', 'girder_types.section as type_section', 'spans.id as span_row_id', 'structures.skew_deg', 'structures.adtt');
    const spans = new Map((await db('spans').select('*')).map((span) => [span.id as number, span as StoredSpan]));
    const rows = await db('strand_rows').select('*').orderBy(['girder_id', 'row_order']);
    return girders.map((girder) => {
      const stored: StoredGirder = { girder, typeSection: girder.type_section, strandRows: rows.filter((row) => row.girder_id === girder.id) };
      return {
        units: 'si',
        ...girderCalcFileParts(stored, spans.get(girder.span_row_id)!, girder.skew_deg),
        condition: { superstructure: 7 },
        traffic: { adtt: girder.adtt ?? 0 },
        vehicles: ['hl93', 'type-3'],
      };
    });
  }

  it('has a demo inventory of 2–4 spans per structure with girders of several types', async () => {
    const perStructure = await testDb.db('spans').select('structure_id').count('* as spans').groupBy('structure_id');
    expect(perStructure.length).toBeGreaterThanOrEqual(40);
    expect(perStructure.every((row) => Number(row.spans) >= 2 && Number(row.spans) <= 4)).toBe(true);
    const types = await testDb.db('girders').distinct('girder_type_id');
    expect(types.length).toBeGreaterThanOrEqual(3);
    expect(await testDb.db('girders').whereRaw("jsonb_array_length(profiles) > 0").first()).toBeDefined();
  });

  it('parses every girder as a rate file and rates a sample of them', async () => {
    const files = await rateFilesOfAllGirders();
    const problems = files.flatMap((file, index) => {
      const parsed = parseRateFile(file);
      return parsed.ok ? [] : [`girder ${index}: ${parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`];
    });
    expect(problems).toEqual([]);
    for (const file of files.filter((_, index) => index % 97 === 0)) {
      const parsed = parseRateFile(file);
      if (!parsed.ok) throw new Error('unreachable');
      const output = rateGirderLine(parsed.file, { withoutMargin: true });
      expect(output.summary.controlling.length).toBeGreaterThan(0);
      expect(output.caution).toMatch(/licensed engineer/);
    }
  });
});
