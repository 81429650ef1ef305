/**
 * Acceptance test of the rating assembly: the calculation file the server assembles for a damaged
 * girder of the demo scenario equals a file written beforehand.
 *
 * The expected file, fixtures/bv-s-0136-span-1-girder-3.rate.json, was written by hand from the
 * demo seed sources, each key checked against calc-file.md and the inventory migration's columns;
 * it was not copied from the server's answer. Where the seeds draw from their fixed-seed generator,
 * the draws were computed by running the seeds' own functions (`seededRandom`, `demoStructures`,
 * `demoConditions`) in a scratch script, and the rest worked out from the generator code:
 * - structure BV-S-0136 is the 30th of `demoStructures()` (index 29): ADTT 2108. Its conditions
 *   (`demoConditions()`): superstructure 6 and skew 20°. The damage inspection of 2026-11-18
 *   (seeds/demo-inspections.ts) says superstructure 4 and is submitted, not yet accepted; its
 *   findings are applied, so its condition rating goes with them: the file carries 4.
 * - demo-inventory draws 7 numbers per structure; this structure's give 4 spans of 22.0 m, 4 girders
 *   at 2250 mm, an AASHTO Type III I-girder (22 m < 24 m; section from seeds/data/girder-types.json),
 *   f'c 41 MPa, 22 bottom strands as rows r1 (12 at 50 mm) and r2 (10 at 100 mm), fpe 1093 MPa, and
 *   no harped row (span not over 26 m). The span: overhang 900 mm, roadway (4 − 1) × 2250 + 2 × 900
 *   − 2 × 450 = 7650 mm, barrier face 450 mm inside the exterior girders, deck 200 mm on a 25 mm
 *   haunch, deck width = girder spacing, a 60 mm overlay, two 7.5 kN/m barriers and a 10 kN
 *   diaphragm at midspan (11.0 m). Girder 3 of 4 is interior.
 * - the damage: the two findings of that inspection on girder 3, on the bottom row (r1), as
 *   damage entries (shared `damageEntryOfFinding`): strands 2 and 3 lost over 11.0–12.5 m, then a
 *   25 % section loss of strand 4 over 10.0–13.0 m — one inspection, so in finding-id order.
 * - the run's choices: strain compatibility with the power strand curve and the Whitney block,
 *   vehicles hl93 and type-3 by library id (their stored versions are the engine's), and the
 *   lrfr-default policy inline as shipped (shared/src/engine/data/policies/lrfr-default.json).
 *
 * Finding ids are database ids, so the fixture holds a placeholder in each `findingId`, naming the
 * finding by its kind; the test looks up the girder's findings by kind and puts their ids in before
 * comparing. That way the comparison also checks that each entry came from the right finding.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parseRateFile, rateGirderLine, type RatingDetail } from '../../shared/src';
import { syncReferenceLibrary } from '../../backend/src/library/reference-library';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { seed as seedDemoInspections } from '../../seeds/demo-inspections';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Tomasz Brenek, rating engineer of the East and South districts (demo-users.ts). */
const RATER_EAST_SOUTH = 'bv-staff-2029';

const FIXTURE = path.join(__dirname, 'fixtures', 'bv-s-0136-span-1-girder-3.rate.json');

/** The placeholder the fixture holds in `findingId`, by the kind of finding it stands for. */
const FINDING_PLACEHOLDERS = {
  'lost-strands': '<id of the lost-strands finding>',
  'strand-section-loss': '<id of the strand-section-loss finding>',
} as const;
type PlaceholderKind = keyof typeof FINDING_PLACEHOLDERS;

/** The expected file with each placeholder replaced by the id of that finding on the girder. */
function expectedCalcFile(findingIds: Record<PlaceholderKind, number>): Record<string, unknown> {
  const file = JSON.parse(readFileSync(FIXTURE, 'utf8')) as { damage: { findingId: unknown }[] };
  const byPlaceholder = new Map(Object.entries(FINDING_PLACEHOLDERS).map(([kind, placeholder]) => [placeholder as unknown, findingIds[kind as PlaceholderKind]]));
  for (const entry of file.damage) {
    if (!byPlaceholder.has(entry.findingId)) throw new Error(`the fixture's findingId ${JSON.stringify(entry.findingId)} is not a known placeholder`);
    entry.findingId = byPlaceholder.get(entry.findingId);
  }
  return file;
}

describe('rating assembly of a seeded damaged girder', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  let rater: SignInClient;

  beforeAll(async () => {
    testDb = await createTestDatabase();
    // The demo loads in the order a new database runs them (scripts/lib/local-database.ts), and the
    // reference library as tests/api/ratings.test.ts syncs it: last, which gives the same rows here.
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    await seedDemoConditions(testDb.db);
    await seedDemoInspections(testDb.db);
    await syncReferenceLibrary(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    rater = new SignInClient(bed.server.url);
    await rater.signInAs(RATER_EAST_SOUTH);
  }, 60_000);
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  /** Span 1 of BV-S-0136, its girder 3, and the ids of that girder's findings by kind. */
  async function damagedGirder() {
    const span = (await testDb.db('spans')
      .join('structures', 'structures.id', 'spans.structure_id')
      .where({ 'structures.structure_number': 'BV-S-0136', 'spans.span_index': 1 })
      .first('spans.id')) as { id: number };
    const girder = (await testDb.db('girders').where({ span_id: span.id, girder_number: 3 }).first('id')) as { id: number };
    const findings = (await testDb.db('findings').where({ girder_id: girder.id }).orderBy('id').select('id', 'kind')) as { id: number; kind: string }[];
    expect(findings.map((finding) => finding.kind)).toEqual(['lost-strands', 'strand-section-loss']);
    const idOf = (kind: PlaceholderKind) => findings.find((finding) => finding.kind === kind)!.id;
    return { spanId: span.id, girderId: girder.id, findingIds: { 'lost-strands': idOf('lost-strands'), 'strand-section-loss': idOf('strand-section-loss') } };
  }

  it('assembles the calculation file written by hand from the seed sources, and stores the engine output of it', async () => {
    const { spanId, girderId, findingIds } = await damagedGirder();
    const response = await rater.request(`/api/spans/${spanId}/ratings`, {
      json: { girderIds: [girderId], vehicleIds: ['hl93', 'type-3'], policyId: 'lrfr-default', strandCurve: 'power', concreteModel: 'whitney' },
    });
    expect(response.status).toBe(201);
    const rating = JSON.parse(response.text) as RatingDetail;
    expect(rating.girders.map((girder) => girder.girderId)).toEqual([girderId]);
    const [girder] = rating.girders;

    expect(girder!.calcFile).toEqual(expectedCalcFile(findingIds));
    // The record says where the condition rating came from.
    expect(rating.warnings[0]).toBe("superstructure condition 4 from the inspection of 2026-11-18, submitted and not yet accepted (the structure's accepted rating is 6)");

    // The file is complete on its own: the engine reads it and gives the stored output again.
    const parsed = parseRateFile(girder!.calcFile);
    if (!parsed.ok) throw new Error(parsed.issues.map((issue) => `${issue.path}: ${issue.message}`).join('; '));
    expect(girder!.output).toEqual(JSON.parse(JSON.stringify(rateGirderLine(parsed.file))));
  });
});
