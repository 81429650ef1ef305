import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import type {
  AlertItem,
  FindingDetail,
  HistoryEvent,
  ImportDetail,
  InspectionDetail,
  Page,
  PriorRatingSummary,
  RatingDetail,
  RatingSetup,
  SignedInUser,
  StructureDetail,
  StructureFeatureCollection,
} from '../../shared/src';
import { toSignedInUser } from '../../backend/src/auth/auth.service';
import { checkImport, commitImport } from '../../backend/src/imports/imports.service';
import { syncReferenceLibrary } from '../../backend/src/library/reference-library';
import { findUserBySubject } from '../../backend/src/users/users.repository';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient, type ClientResponse } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff (scripts/lib/local-identity-provider/demo-users.ts) and their districts. */
const STAFF = {
  inspectorNorth: 'bv-staff-1041',
  inspectorSouth: 'bv-staff-1057',
  raterCentral: 'bv-staff-2013',
  raterEastSouth: 'bv-staff-2029',
  managerNetwork: 'bv-staff-3002',
} as const;
type Staff = keyof typeof STAFF;

const SAMPLES = path.join(__dirname, '../../data-import/samples');
const TEMPLATES = path.join(__dirname, '../../data-import/templates');
const headerOf = (template: string) => readFileSync(path.join(TEMPLATES, `${template}.csv`), 'utf8').split(/\r?\n/)[0]!;
const FINDING_HEADERS = headerOf('findings').split(',');
const PRIOR_HEADERS = headerOf('prior-ratings').split(',');

/** A CSV of the template's header and the rows given by column; columns left out stay empty. */
function csvOf(headers: readonly string[], rows: readonly Record<string, string | number>[]): string {
  const cell = (value: string | number | undefined) => (value === undefined ? '' : /[",]/.test(String(value)) ? `"${String(value).replace(/"/g, '""')}"` : String(value));
  return [headers.join(','), ...rows.map((row) => headers.map((header) => cell(row[header])).join(','))].join('\r\n') + '\r\n';
}
const findingsCsv = (...rows: Record<string, string | number>[]) => csvOf(FINDING_HEADERS, rows);
const priorRatingsCsv = (...rows: Record<string, string | number>[]) => csvOf(PRIOR_HEADERS, rows);

/** A bottom-flange spall well inside any demo girder and span (invented numbers, common practice, no source). */
const spallAt = (structure: string, spanIndex: number, girderNumber: number, inspectedOn: string, notes = 'Invented test finding.') => ({
  structure_number: structure,
  span_index: spanIndex,
  girder_number: girderNumber,
  inspected_on: inspectedOn,
  kind: 'spall',
  severity: 'moderate',
  from_m: 1,
  to_m: 2,
  spall_depth_mm: 30,
  spall_width_mm: 100,
  notes,
});

type ErrorBody = { error: { code: string; message: string } };
const json = <T>(response: ClientResponse) => JSON.parse(response.text) as T;

describe('imports API: findings and prior ratings', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  let workFolder: string;
  const clients = new Map<Staff, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    await seedDemoConditions(testDb.db);
    await syncReferenceLibrary(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    for (const staff of Object.keys(STAFF) as Staff[]) {
      const client = new SignInClient(bed.server.url);
      await client.signInAs(STAFF[staff]);
      clients.set(staff, client);
    }
    workFolder = mkdtempSync(path.join(tmpdir(), 'spanledger-imports-'));
  }, 60_000);
  afterAll(async () => {
    rmSync(workFolder, { recursive: true, force: true });
    await bed.stop();
    await testDb.drop();
  });

  const call = async <T>(staff: Staff, url: string, init: { json?: unknown } = {}) => json<T>(await clients.get(staff)!.request(url, init));

  function upload(staff: Staff, bytes: Buffer | string, fileName: string) {
    const form = new FormData();
    form.append('file', new Blob([typeof bytes === 'string' ? bytes : new Uint8Array(bytes)]), fileName);
    return clients.get(staff)!.request('/api/imports', { multipart: form });
  }
  const checkedBy = async (staff: Staff, bytes: Buffer | string, fileName: string) => json<ImportDetail>(await upload(staff, bytes, fileName));
  const commitBy = async (staff: Staff, checked: Pick<ImportDetail, 'id' | 'version'>) => json<ImportDetail>(await clients.get(staff)!.request(`/api/imports/${checked.id}/commit`, { json: { version: checked.version } }));

  /** A demo person as single sign-on would give them with other districts: the samples touch districts no one demo person holds. */
  async function personWith(staff: Staff, districts: readonly string[]): Promise<SignedInUser> {
    return { ...toSignedInUser((await findUserBySubject(testDb.db, STAFF[staff]))!), districts };
  }
  /** The check of `POST /api/imports`, called as the service for a person the demo sign-in does not offer. */
  let fileCount = 0;
  async function checkAs(user: SignedInUser, bytes: Buffer | string, fileName: string): Promise<ImportDetail> {
    const filePath = path.join(workFolder, `${(fileCount += 1)}-${fileName}`);
    writeFileSync(filePath, bytes);
    return checkImport({ db: testDb.db, user }, { filePath, fileName, byteSize: Buffer.byteLength(bytes), template: null });
  }

  const structureNamed = async (structureNumber: string) => (await testDb.db('structures').where({ structure_number: structureNumber }).first('id', 'district')) as { id: number; district: string };
  async function spanOf(structureNumber: string, spanIndex: number): Promise<{ id: number; rerating_due_since: Date | null }> {
    return testDb.db('spans').join('structures', 'structures.id', 'spans.structure_id').where({ 'structures.structure_number': structureNumber, 'spans.span_index': spanIndex }).first('spans.id', 'spans.rerating_due_since');
  }
  async function girderOf(structureNumber: string, spanIndex: number, girderNumber: number): Promise<number> {
    const span = await spanOf(structureNumber, spanIndex);
    return ((await testDb.db('girders').where({ span_id: span.id, girder_number: girderNumber }).first('id')) as { id: number }).id;
  }

  it('records the sample findings in one inspection per structure and day, open on the damage register of each girder, their spans due for re-rating', async () => {
    const rater = await personWith('raterCentral', ['Central District', 'East District', 'North District']);
    const crackOnlySpanBefore = (await spanOf('BV-C-0143', 2)).rerating_due_since;
    const startedAt = new Date();
    const checked = await checkAs(rater, readFileSync(path.join(SAMPLES, 'findings.csv')), 'findings.csv');
    expect(checked.problems).toEqual([]);
    expect(checked.counts).toEqual({ findings: { rows: 6, create: 6, update: 0, unchanged: 0, refused: 0, fileRows: 6 } });
    expect(await testDb.db('inspections').count<{ count: string }[]>('* as count')).toEqual([{ count: '0' }]);

    const committed = await commitImport({ db: testDb.db, user: rater }, checked.id, checked.version);
    expect(committed).toMatchObject({ state: 'committed', problems: [] });

    // A rater may accept inspections, so the import files theirs accepted, by them, marked as imported by this import.
    const inspections = await testDb.db('inspections').join('structures', 'structures.id', 'inspections.structure_id').orderBy('structure_number').select('structure_number', 'inspections.id', 'state', 'source', 'import_id', 'inspector_id', 'reviewed_by', testDb.db.raw("to_char(inspected_on, 'YYYY-MM-DD') as inspected_on"));
    expect(inspections.map(({ id: _id, ...inspection }) => inspection)).toEqual([
      { structure_number: 'BV-C-0143', inspected_on: '2026-11-24', state: 'accepted', source: 'import', import_id: checked.id, inspector_id: rater.id, reviewed_by: rater.id },
      { structure_number: 'BV-E-0108', inspected_on: '2026-11-25', state: 'accepted', source: 'import', import_id: checked.id, inspector_id: rater.id, reviewed_by: rater.id },
      { structure_number: 'BV-N-0157', inspected_on: '2026-11-26', state: 'accepted', source: 'import', import_id: checked.id, inspector_id: rater.id, reviewed_by: rater.id },
    ]);
    const central = await call<InspectionDetail>('managerNetwork', `/api/inspections/${inspections[0]!.id}`);
    expect(central.findings.map((finding) => [finding.spanIndex, finding.girderNumber, finding.kind])).toEqual([
      [1, 1, 'spall'],
      [1, 1, 'exposed-strands'],
      [2, 3, 'crack'],
    ]);

    // Where people look: the girder's damage register, and the damage a rating of the span applies.
    const register = await call<FindingDetail[]>('inspectorSouth', `/api/girders/${await girderOf('BV-C-0143', 1, 1)}/findings`);
    expect(register.map((finding) => [finding.kind, finding.registerState, finding.damageEntry?.kind ?? null])).toEqual(
      expect.arrayContaining([
        ['spall', 'open', 'concrete-loss'],
        ['exposed-strands', 'open', 'exposed-strands'],
      ]),
    );
    const eastSpan = await spanOf('BV-E-0108', 1);
    const open = await call<FindingDetail[]>('raterEastSouth', `/api/spans/${eastSpan.id}/open-findings`);
    // Broken wires: 2 of a seven-wire strand's wires, a section loss of 2/7 (hand check from the published formula, wires ÷ 7).
    expect(open.map((finding) => [finding.kind, finding.damageEntry])).toEqual([
      ['strand-section-loss', expect.objectContaining({ kind: 'strand-area-loss', rowId: 'r1', strands: [10, 11], lossFraction: 0.2 })],
      ['broken-wires', expect.objectContaining({ kind: 'strand-area-loss', rowId: 'r2', count: 1, lossFraction: 2 / 7 })],
    ]);

    // Spans with damage that acts on flexure are due for re-rating; the crack-only span is as it was.
    for (const [structureNumber, spanIndex] of [['BV-C-0143', 1], ['BV-E-0108', 1], ['BV-N-0157', 2]] as const) {
      expect((await spanOf(structureNumber, spanIndex)).rerating_due_since!.getTime()).toBeGreaterThanOrEqual(startedAt.getTime() - 1000);
    }
    expect((await spanOf('BV-C-0143', 2)).rerating_due_since).toEqual(crackOnlySpanBefore);

    // Newly broken wires are critical: the East District's raters hear of them at once.
    const alerts = await call<AlertItem[]>('raterEastSouth', '/api/alerts');
    expect(alerts.map((alert) => alert.message)).toEqual([expect.stringMatching(/^Broken wires on girder 4 of span 1, BV-E-0108/)]);
    const history = await testDb.db('audit_events').whereIn('action', ['inspection.imported', 'finding.recorded']).select('action');
    expect(history.filter((event) => event.action === 'inspection.imported')).toHaveLength(3);
    expect(history.filter((event) => event.action === 'finding.recorded')).toHaveLength(6);
    // And where people read it: the structure's history names the inspection and each finding by where it is.
    const withFindings = await structureNamed('BV-C-0143');
    const read = await call<Page<HistoryEvent>>('inspectorSouth', `/api/structures/${withFindings.id}/history`);
    expect(read.items.filter((event) => event.entityType === 'inspection' || event.entityType === 'finding').map((event) => `${event.subject} ${event.action}`).sort()).toEqual([
      'Finding on span 1, girder 1 (inspection of 2026-11-24) finding.recorded',
      'Finding on span 1, girder 1 (inspection of 2026-11-24) finding.recorded',
      'Finding on span 2, girder 3 (inspection of 2026-11-24) finding.recorded',
      'Inspection of 2026-11-24 inspection.imported',
    ]);

    // Findings for a day on file, or before a later inspection on file, would stand beside what that inspection recorded.
    const again = await checkAs(rater, findingsCsv(spallAt('BV-C-0143', 1, 2, '2026-11-24'), spallAt('BV-C-0143', 1, 2, '2026-10-01'), spallAt('BV-N-0157', 1, 1, '2026-11-27')), 'findings.csv');
    expect(again.problems.map((problem) => [problem.row, problem.column, problem.value])).toEqual([
      [2, 'inspected_on', '2026-11-24'],
      [3, 'inspected_on', '2026-10-01'],
    ]);
    expect(again.problems[0]!.message).toMatch(/has an inspection of 2026-11-24 on file \(accepted, Priya Halloran\)/);
    expect(again.problems[1]!.message).toMatch(/later inspection on file \(2026-11-24/);
    expect(again.counts.findings).toEqual({ rows: 3, create: 1, update: 0, unchanged: 0, refused: 2, fileRows: 3 });
  });

  it("files an inspector's imported findings as submitted, waiting for review, and adds them to the inspector's own draft of the day, which stays theirs to submit", async () => {
    const checked = await checkedBy('inspectorNorth', findingsCsv(spallAt('BV-N-0108', 1, 1, '2026-11-20'), spallAt('BV-N-0108', 1, 2, '2026-11-20')), 'findings.csv');
    expect(checked.problems).toEqual([]);
    expect(checked.counts.findings).toEqual({ rows: 2, create: 2, update: 0, unchanged: 0, refused: 0, fileRows: 2 });
    expect(await commitBy('inspectorNorth', checked)).toMatchObject({ state: 'committed' });
    const [imported] = await call<{ id: number; state: string; inspectorName: string; findingCount: number }[]>('raterCentral', `/api/structures/${(await structureNamed('BV-N-0108')).id}/inspections`);
    expect(imported).toMatchObject({ state: 'submitted', inspectorName: 'Dana Whitcombe', findingCount: 2 });
    const detail = await call<InspectionDetail>('inspectorNorth', `/api/inspections/${imported!.id}`);
    expect(detail).toMatchObject({ reviewed: null, submittedAt: expect.any(String) });
    expect(detail.findings.map((finding) => finding.registerState)).toEqual(['open', 'open']);

    // Her own draft of a day takes the day's findings, and stays a draft for her to submit.
    const structure = await structureNamed('BV-N-0115');
    const draft = await call<InspectionDetail>('inspectorNorth', `/api/structures/${structure.id}/inspections`, { json: { inspectedOn: '2026-11-27', kind: 'routine' } });
    expect(draft.state).toBe('draft');
    const intoDraft = await checkedBy('inspectorNorth', findingsCsv(spallAt('BV-N-0115', 1, 1, '2026-11-27'), spallAt('BV-N-0115', 1, 3, '2026-11-27')), 'findings.csv');
    expect(intoDraft.counts.findings).toEqual({ rows: 2, create: 2, update: 0, unchanged: 0, refused: 0, fileRows: 2 });
    expect(await commitBy('inspectorNorth', intoDraft)).toMatchObject({ state: 'committed' });
    const filled = await call<InspectionDetail>('inspectorNorth', `/api/inspections/${draft.id}`);
    expect(filled).toMatchObject({ state: 'draft', findingCount: 2 });
    expect(filled.findings.map((finding) => finding.registerState)).toEqual(['draft', 'draft']);
    expect((await testDb.db('inspections').where({ id: draft.id }).first('source', 'import_id'))).toEqual({ source: 'field', import_id: null });

    // The same key again is the same finding: one left as it is, one changed.
    const changed = await checkedBy('inspectorNorth', findingsCsv(spallAt('BV-N-0115', 1, 1, '2026-11-27'), spallAt('BV-N-0115', 1, 3, '2026-11-27', 'Grown since the morning.')), 'findings.csv');
    expect(changed.counts.findings).toEqual({ rows: 2, create: 0, update: 1, unchanged: 1, refused: 0, fileRows: 2 });
    expect(await commitBy('inspectorNorth', changed)).toMatchObject({ state: 'committed' });
    const refilled = await call<InspectionDetail>('inspectorNorth', `/api/inspections/${draft.id}`);
    expect(refilled.findings.map((finding) => [finding.girderNumber, finding.notes, finding.version])).toEqual([
      [1, 'Invented test finding.', 1],
      [3, 'Grown since the morning.', 2],
    ]);
    // While her draft is being written, no one imports another day of that structure.
    const northRater = await personWith('raterCentral', ['North District']);
    const stillWritten = await checkAs(northRater, findingsCsv(spallAt('BV-N-0115', 1, 1, '2026-11-28')), 'findings.csv');
    expect(stillWritten.problems).toEqual([expect.objectContaining({ row: 2, column: 'inspected_on', message: expect.stringMatching(/being written \(2026-11-27, Dana Whitcombe\)/) })]);
  });

  it("refuses an inspector's prior ratings row by row, and a finding naming a strand row its girder lacks at that row and cell", async () => {
    const priors = await checkedBy(
      'inspectorSouth',
      priorRatingsCsv(
        { structure_number: 'BV-S-0115', span_index: 1, lowest_legal_rf: 1.1, design_inventory_rf: 0.9, approved_on: '2018-06-07', source_note: 'Invented test rating.' },
        { structure_number: 'BV-S-0136', lowest_legal_rf: 1.3, approved_on: '2016-02-11', source_note: 'Invented test rating.' },
      ),
      'prior-ratings.csv',
    );
    expect(priors.problems.map((problem) => [problem.row, problem.column, problem.message])).toEqual([
      [2, 'structure_number, span_index', 'you may not import prior ratings in South District'],
      [3, 'structure_number, span_index', 'you may not import prior ratings in South District'],
    ]);
    expect(priors.allowed.commit).toBe(false);

    // On a girder in the register: the engine's own check of the finding.
    const lacking = await checkedBy('raterCentral', findingsCsv({ ...spallAt('BV-C-0129', 1, 2, '2026-11-29'), kind: 'exposed-strands', spall_depth_mm: '', spall_width_mm: '', strand_row_id: 'r9', strand_indices: '0' }), 'findings.csv');
    expect(lacking.problems).toEqual([expect.objectContaining({ sheet: 'findings', row: 2, column: 'strand_row_id', value: 'r9' })]);
    expect(lacking.problems[0]!.message).toMatch(/r9/);
  });

  it('checks a finding on a girder the same file adds against the strand rows the file gives it, and records it once the girder is written', async () => {
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.readFile(path.join(SAMPLES, 'west-district-inventory.xlsx'));
    const sheet = workbook.addWorksheet('findings');
    sheet.addRow(FINDING_HEADERS);
    const exposed = (rowId: string, girderNumber: number) => FINDING_HEADERS.map((header) => ({ structure_number: 'BV-W-0101', span_index: 1, girder_number: girderNumber, inspected_on: '2026-11-30', kind: 'exposed-strands', severity: 'minor', from_m: 2, to_m: 3, strand_row_id: rowId, strand_indices: '0', notes: 'Invented test finding.' })[header] ?? null);
    sheet.addRow(exposed('r1', 1));
    sheet.addRow(exposed('r9', 2));
    const westRater = await personWith('raterCentral', ['West District']);
    const checked = await checkAs(westRater, Buffer.from(await workbook.xlsx.writeBuffer()), 'west with findings.xlsx');
    expect(checked.problems).toEqual([expect.objectContaining({ sheet: 'findings', row: 3, column: 'strand_row_id', value: 'r9', message: expect.stringMatching(/girder 2 of span 1 has no strand row "r9" \(its rows: r1, r2\)/) })]);

    sheet.spliceRows(3, 1);
    const clean = await checkAs(westRater, Buffer.from(await workbook.xlsx.writeBuffer()), 'west with findings.xlsx');
    expect(clean.problems).toEqual([]);
    expect(clean.counts.findings).toEqual({ rows: 1, create: 1, update: 0, unchanged: 0, refused: 0, fileRows: 1 });
    expect(await commitImport({ db: testDb.db, user: westRater }, clean.id, clean.version)).toMatchObject({ state: 'committed' });
    const register = await call<FindingDetail[]>('raterCentral', `/api/girders/${await girderOf('BV-W-0101', 1, 1)}/findings`);
    expect(register).toEqual([expect.objectContaining({ kind: 'exposed-strands', registerState: 'open', strands: { rowId: 'r1', strands: [0] } })]);
  });

  it("records the sample prior ratings: on the structure's list, as its rating-of-record figures until Spanledger approves a newer one, and as what a span's rating is compared with", async () => {
    const checked = await checkedBy('managerNetwork', readFileSync(path.join(SAMPLES, 'prior-ratings.csv')), 'prior-ratings.csv');
    expect(checked.problems).toEqual([]);
    expect(checked.counts).toEqual({ 'prior-ratings': { rows: 6, create: 6, update: 0, unchanged: 0, refused: 0, fileRows: 6 } });
    expect(await commitBy('managerNetwork', checked)).toMatchObject({ state: 'committed' });
    expect(await testDb.db('audit_events').where({ action: 'prior-rating.recorded' }).count<{ count: string }[]>('* as count')).toEqual([{ count: '6' }]);

    const south = await structureNamed('BV-S-0115');
    const listed = await call<PriorRatingSummary[]>('inspectorSouth', `/api/structures/${south.id}/prior-ratings`);
    expect(listed).toEqual([
      expect.objectContaining({ spanIndex: 1, lowestLegalRf: 1.16, lowestInventoryRf: 0.91, approvedOn: '2018-06-07', importId: checked.id, previous: null, created: expect.objectContaining({ by: 'Greer Ashdown' }) }),
      expect.objectContaining({ spanIndex: 2, lowestLegalRf: 1.19, lowestInventoryRf: 0.93, approvedOn: '2018-06-07', sourceNote: expect.stringMatching(/^Span 2 of the June 2018 rating report/) }),
    ]);
    const southHistory = await call<Page<HistoryEvent>>('inspectorSouth', `/api/structures/${south.id}/history`);
    expect(southHistory.items.filter((event) => event.entityType === 'prior-rating').map((event) => event.subject).sort()).toEqual(['Rating on file of 2018-06-07 (span 1)', 'Rating on file of 2018-06-07 (span 2)']);
    // The structure's figures are the lowest of its newest prior ratings: what the map colours it by.
    expect((await call<StructureDetail>('inspectorSouth', `/api/structures/${south.id}`)).ratingOfRecord).toEqual({ lowestLegalRatingFactor: 1.16, designInventoryRatingFactor: 0.91, approvedAt: '2018-06-07T00:00:00.000Z', approvedOn: '2018-06-07' });
    const legalOnly = await structureNamed('BV-C-0171');
    const onMap = await call<StructureFeatureCollection>('raterCentral', '/api/structures?search=BV-C-0171');
    expect(onMap.features.map((feature) => [feature.properties.legalRatingFactor, feature.properties.designInventoryRatingFactor])).toEqual([[1.22, null]]);

    // A later file: an older rating of BV-C-0171, and BV-C-0101's again as it is.
    const older = await checkedBy(
      'managerNetwork',
      priorRatingsCsv(
        { structure_number: 'BV-C-0171', lowest_legal_rf: 1.4, design_inventory_rf: 1.05, approved_on: '2009-10-02', source_note: 'Invented earlier rating.' },
        { structure_number: 'BV-C-0101', lowest_legal_rf: 1.48, design_inventory_rf: 1.12, approved_on: '2015-09-03', source_note: 'Rating report of September 2015, file BV-R-0201. Sample data, invented for the demo (data-import/samples).' },
      ),
      'prior-ratings.csv',
    );
    expect(older.counts['prior-ratings']).toEqual({ rows: 2, create: 1, update: 0, unchanged: 1, refused: 0, fileRows: 2 });
    expect(await commitBy('managerNetwork', older)).toMatchObject({ state: 'committed' });
    const history = await call<PriorRatingSummary[]>('raterCentral', `/api/structures/${legalOnly.id}/prior-ratings`);
    expect(history.map((rating) => [rating.approvedOn, rating.lowestLegalRf, rating.previous?.lowestLegalRf ?? null, rating.importId])).toEqual([
      ['2012-04-26', 1.22, 1.4, checked.id],
      ['2009-10-02', 1.4, null, older.id],
    ]);
    expect((await call<StructureDetail>('raterCentral', `/api/structures/${legalOnly.id}`)).ratingOfRecord).toMatchObject({ lowestLegalRatingFactor: 1.22, designInventoryRatingFactor: null });

    // A span's rating is compared with its own prior rating, else its structure's, while Spanledger has approved none.
    const setup = await call<RatingSetup>('raterEastSouth', `/api/spans/${(await spanOf('BV-S-0115', 2)).id}/rating-setup`);
    expect(setup.ratingOfRecord).toMatchObject({ lowestLegalRf: 1.19, lowestInventoryRf: 0.93, priorRating: { approvedOn: '2018-06-07', spanIndex: 2 } });
    const centralSpan = await spanOf('BV-C-0101', 1);
    const ran = await call<RatingDetail>('raterCentral', `/api/spans/${centralSpan.id}/ratings`, { json: { vehicleIds: ['hl93', 'type-3'], policyId: 'lrfr-default' } });
    expect(ran.previousRecord).toMatchObject({ lowestLegalRf: 1.48, lowestInventoryRf: 1.12, priorRating: { approvedOn: '2015-09-03', spanIndex: null, sourceNote: expect.stringMatching(/^Rating report of September 2015/) } });
    const submitted = await call<RatingDetail>('raterCentral', `/api/ratings/${ran.id}/submit`, { json: { version: ran.version, comment: '' } });
    const approved = await call<RatingDetail>('managerNetwork', `/api/ratings/${ran.id}/approve`, { json: { version: submitted.version, comment: 'Checked.' } });
    expect(approved.state).toBe('approved');
    // Approved now, it is newer than every prior rating: the structure's figures are Spanledger's.
    const figures = (await call<StructureDetail>('raterCentral', `/api/structures/${(await structureNamed('BV-C-0101')).id}`)).ratingOfRecord;
    expect(figures).toEqual({ lowestLegalRatingFactor: approved.lowestLegalRf, designInventoryRatingFactor: approved.lowestInventoryRf, approvedAt: approved.reviewed!.at, approvedOn: null });
  }, 60_000);

  it('leaves no inspection, finding or prior rating behind when a fault stops the commit of a workbook holding both', async () => {
    const workbook = new ExcelJS.Workbook();
    const findings = workbook.addWorksheet('findings');
    findings.addRow(FINDING_HEADERS);
    const spall = spallAt('BV-C-0122', 1, 1, '2026-12-01');
    findings.addRow(FINDING_HEADERS.map((header) => (spall as Record<string, string | number>)[header] ?? null));
    const priors = workbook.addWorksheet('prior-ratings');
    priors.addRow(PRIOR_HEADERS);
    priors.addRow(['BV-C-0122', null, 1.27, 1.01, '2014-08-19', 'Invented test rating.']);
    const rater = await personWith('raterCentral', ['Central District']);
    const checked = await checkAs(rater, Buffer.from(await workbook.xlsx.writeBuffer()), 'central sheets.xlsx');
    expect(checked.problems).toEqual([]);
    expect(checked.counts).toEqual({ findings: { rows: 1, create: 1, update: 0, unchanged: 0, refused: 0, fileRows: 1 }, 'prior-ratings': { rows: 1, create: 1, update: 0, unchanged: 0, refused: 0, fileRows: 1 } });
    const structure = await structureNamed('BV-C-0122');
    const counts = async () => ({
      inspections: Number((await testDb.db('inspections').where({ structure_id: structure.id }).count<{ count: string }[]>('* as count'))[0]!.count),
      priorRatings: Number((await testDb.db('prior_ratings').where({ structure_id: structure.id }).count<{ count: string }[]>('* as count'))[0]!.count),
      figures: await testDb.db('structures').where({ id: structure.id }).first('rating_of_record_legal_rf'),
    });
    await expect(
      commitImport({ db: testDb.db, user: rater }, checked.id, checked.version, {
        afterRowsWritten: () => {
          throw new Error('the database went away');
        },
      }),
    ).rejects.toThrow('the database went away');
    expect(await counts()).toEqual({ inspections: 0, priorRatings: 0, figures: { rating_of_record_legal_rf: null } });
    expect((await testDb.db('imports').where({ id: checked.id }).first('state')).state).toBe('checked');

    expect(await commitImport({ db: testDb.db, user: rater }, checked.id, checked.version)).toMatchObject({ state: 'committed' });
    expect(await counts()).toEqual({ inspections: 1, priorRatings: 1, figures: { rating_of_record_legal_rf: 1.27 } });
    // Every imported inspection and prior rating names the import that wrote it, once that import is committed.
    expect(await testDb.db('inspections').where({ source: 'import' }).whereNull('import_id').first('id')).toBeUndefined();
    expect(await testDb.db('prior_ratings').whereNull('import_id').first('id')).toBeUndefined();
  });

  it('refuses a findings import to a manager, who records neither inspections nor findings', async () => {
    const response = await checkedBy('managerNetwork', findingsCsv(spallAt('BV-C-0122', 1, 2, '2026-12-02')), 'findings.csv');
    expect(response.problems).toEqual([expect.objectContaining({ row: 2, message: 'you may not import findings in Central District' })]);
    const error = await clients.get('managerNetwork')!.request(`/api/imports/${response.id}/commit`, { json: { version: response.version } });
    expect(json<ErrorBody>(error).error.code).toBe('read_only');
  });
});
