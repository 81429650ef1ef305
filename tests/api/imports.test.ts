import { readFileSync } from 'node:fs';
import path from 'node:path';
import ExcelJS from 'exceljs';
import type { ImportDetail, ImportSummary, StructureDetail } from '../../shared/src';
import { toSignedInUser } from '../../backend/src/auth/auth.service';
import { commitImport } from '../../backend/src/imports/imports.service';
import { findUserBySubject } from '../../backend/src/users/users.repository';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient, type ClientResponse } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff (scripts/lib/local-identity-provider/demo-users.ts) and their districts. */
const STAFF = {
  inspectorSouth: 'bv-staff-1057',
  raterCentral: 'bv-staff-2013',
  managerNetwork: 'bv-staff-3002',
} as const;
type Staff = keyof typeof STAFF;

const TEMPLATES = path.join(__dirname, '../../data-import/templates');
const STRUCTURE_HEADERS = readFileSync(path.join(TEMPLATES, 'structures.csv'), 'utf8').split(/\r?\n/)[0]!;

type ErrorBody = { error: { code: string; message: string; details?: { fields?: { field: string }[]; reason?: string } } };
const json = <T>(response: ClientResponse) => JSON.parse(response.text) as T;

/** A structures row in the template's column order (see data-import/templates/structures.csv). */
function structureRow(values: Partial<Record<string, string | number>> & { structure_number: string }): string {
  const defaults: Record<string, string | number> = {
    name: 'Sample bridge',
    route_carried: 'County Road 9',
    feature_crossed: 'Sample Creek',
    district: 'Central District',
    longitude_deg: -97.9,
    latitude_deg: 38.6,
    year_built: 1984,
    adt: 2400,
    adtt: 300,
    skew_deg: 0,
    status: 'open',
  };
  return STRUCTURE_HEADERS.split(',')
    .map((header) => String(values[header] ?? defaults[header] ?? ''))
    .join(',');
}

const csvOf = (...rows: string[]) => [STRUCTURE_HEADERS, ...rows].join('\r\n') + '\r\n';

describe('imports API: checking an upload', () => {
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
  }, 60_000);
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  function upload(staff: Staff, bytes: Buffer | string, fileName: string, fields: Record<string, string> = {}, client = clients.get(staff)!) {
    const form = new FormData();
    for (const [key, value] of Object.entries(fields)) form.append(key, value);
    form.append('file', new Blob([typeof bytes === 'string' ? bytes : new Uint8Array(bytes)], { type: 'application/octet-stream' }), fileName);
    return client.request('/api/imports', { multipart: form });
  }

  it('offers each template as CSV, the same as data-import/templates, and as XLSX', async () => {
    const csv = await clients.get('inspectorSouth')!.request('/api/import-templates/structures.csv');
    expect(csv.status).toBe(200);
    expect(csv.text).toBe(readFileSync(path.join(TEMPLATES, 'structures.csv'), 'utf8'));
    const xlsx = await clients.get('inspectorSouth')!.request('/api/import-templates/strand-rows.xlsx');
    expect(xlsx.status).toBe(200);
    expect(xlsx.headers.get('content-type')).toMatch(/spreadsheetml/);
    expect((await clients.get('inspectorSouth')!.request('/api/import-templates/bridges.csv')).status).toBe(400);
  });

  it('offers every template in one workbook, which uploads as it is: its columns sheet is skipped, its example rows checked', async () => {
    const workbook = await clients.get('raterCentral')!.request('/api/import-templates/all.xlsx');
    expect(workbook.status).toBe(200);
    const read = new ExcelJS.Workbook();
    await read.xlsx.load(workbook.bytes as unknown as ArrayBuffer);
    expect(read.worksheets.map((sheet) => sheet.name)).toEqual(['structures', 'spans', 'girders', 'strand-rows', 'findings', 'prior-ratings', 'columns']);

    const checked = json<ImportDetail>(await upload('raterCentral', workbook.bytes, 'spanledger-import-templates.xlsx'));
    expect(checked.problems.filter((problem) => problem.sheet === 'columns')).toEqual([]);
    expect(Object.keys(checked.counts).sort()).toEqual(['findings', 'girders', 'prior-ratings', 'spans', 'strand-rows', 'structures']);
  });

  it('counts what a file would create, change and leave alone, and writes nothing to the register', async () => {
    const existing = (await testDb.db('structures').where({ district: 'Central District' }).orderBy('structure_number').first('id')) as { id: number };
    const stored = json<StructureDetail>(await clients.get('raterCentral')!.request(`/api/structures/${existing.id}`));
    const asStored = structureRow({
      structure_number: stored.structureNumber,
      name: stored.name,
      route_carried: stored.routeCarried,
      feature_crossed: stored.featureCrossed,
      district: stored.district,
      longitude_deg: stored.longitude,
      latitude_deg: stored.latitude,
      year_built: stored.yearBuilt ?? '',
      year_last_major_work: stored.yearLastMajorWork ?? '',
      adt: stored.adt ?? '',
      adtt: stored.adtt ?? '',
      skew_deg: stored.skewDeg,
      deck_condition: stored.conditions.deck ?? '',
      superstructure_condition: stored.conditions.superstructure ?? '',
      substructure_condition: stored.conditions.substructure ?? '',
      condition_rated_on: stored.conditions.ratedOn ?? '',
      status: stored.status,
      notes: stored.notes,
    });
    const file = csvOf(structureRow({ structure_number: 'BV-C-0901' }), structureRow({ structure_number: 'BV-C-0902', name: 'Second sample bridge' }), asStored, asStored.replace(stored.name, `${stored.name} (renamed)`).replace(stored.structureNumber, stored.structureNumber));
    // The last two rows name the same structure: the file contradicts itself.
    const response = await upload('raterCentral', file, 'structures.csv');
    expect(response.status).toBe(201);
    const checked = json<ImportDetail>(response);
    expect(checked).toMatchObject({ state: 'checked', fileKind: 'csv', fileName: 'structures.csv', uploaded: { by: 'Priya Halloran' }, committed: null });
    expect(checked.problems.map((problem) => [problem.row, problem.column])).toEqual([[5, 'structure_number']]);

    const clean = json<ImportDetail>(await upload('raterCentral', csvOf(structureRow({ structure_number: 'BV-C-0901' }), asStored, asStored.replace(`,${stored.name},`, `,${stored.name} (renamed),`).replace(stored.structureNumber, 'BV-C-0903')), 'structures.csv'));
    expect(clean.problems).toEqual([]);
    expect(clean.counts).toEqual({ structures: { rows: 3, create: 2, update: 0, unchanged: 1, refused: 0, fileRows: 3 } });
    const renamed = json<ImportDetail>(await upload('raterCentral', csvOf(asStored.replace(`,${stored.name},`, `,${stored.name} (renamed),`)), 'structures.csv'));
    expect(renamed.counts).toEqual({ structures: { rows: 1, create: 0, update: 1, unchanged: 0, refused: 0, fileRows: 1 } });

    expect(await testDb.db('structures').whereIn('structure_number', ['BV-C-0901', 'BV-C-0902', 'BV-C-0903']).count<{ count: string }[]>('* as count')).toEqual([{ count: '0' }]);
    const history = json<ImportSummary[]>(await clients.get('managerNetwork')!.request('/api/imports'));
    expect(history.slice(0, 3).map((item) => item.id)).toEqual([renamed.id, clean.id, checked.id]);
  });

  it('names every bad cell by sheet, row, column and value, and reports them all as CSV', async () => {
    const file = csvOf(
      structureRow({ structure_number: 'BV-C-0911', adt: 'lots' }), // text in a number column
      structureRow({ structure_number: 'BV-C-0912', name: '' }), // a required cell left empty
      structureRow({ structure_number: 'BV-C-0913', superstructure_condition: 12 }), // out of range
      structureRow({ structure_number: 'BV-C-0914', status: 'shut' }), // not one of the choices
      structureRow({ structure_number: 'BV-C-0915', condition_rated_on: '31/12/2025' }), // not a date
      structureRow({ structure_number: 'BV-C-0916', adt: 100, adtt: 400 }), // a rule between fields
      structureRow({ structure_number: 'BV-C-0917', district: 'South District' }), // a district the rater may not change
    );
    const checked = json<ImportDetail>(await upload('raterCentral', file, 'structures.csv'));
    const named = checked.problems.map((problem) => `${problem.sheet}!${problem.row}:${problem.column}`);
    expect(named).toEqual([
      'structures!2:adt',
      'structures!3:name',
      'structures!4:superstructure_condition',
      'structures!5:status',
      'structures!6:condition_rated_on',
      'structures!7:adtt',
      'structures!8:structure_number',
    ]);
    expect(checked.problems[0]).toMatchObject({ value: 'lots' });
    expect(checked.problems[6]!.message).toMatch(/South District/);
    // Six rows stop at their own cells; the seventh is judged against the register and refused there: all seven are refused.
    expect(checked.counts).toEqual({ structures: { rows: 1, create: 0, update: 0, unchanged: 0, refused: 7, fileRows: 7 } });

    const report = await clients.get('raterCentral')!.request(`/api/imports/${checked.id}/problems.csv`);
    expect(report.status).toBe(200);
    expect(report.headers.get('content-disposition')).toContain(`import-${checked.id}-problems.csv`);
    const lines = report.text.trim().split(/\r\n/);
    expect(lines[0]).toBe('sheet,row,column,value,problem');
    expect(lines).toHaveLength(8);
    expect(lines[1]).toMatch(/^structures,2,adt,lots,/);
  });

  it('names, in the check, a girder the engine could not rate: a strand row above its section, at that strand row', async () => {
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(readFileSync(path.join(__dirname, '../../data-import/samples/west-district-inventory.xlsx')) as unknown as ArrayBuffer);
    const strandRows = workbook.getWorksheet('strand-rows')!;
    const yColumn = (strandRows.getRow(1).values as unknown[]).indexOf('y_mm');
    // Higher than any girder of the sample is deep: the engine refuses strands outside the concrete.
    strandRows.getRow(2).getCell(yColumn).value = 9000;
    const bytes = Buffer.from(await workbook.xlsx.writeBuffer());

    const checked = json<ImportDetail>(await upload('managerNetwork', bytes, 'west with a strand row too high.xlsx'));
    expect(checked.problems).toEqual([{ sheet: 'strand-rows', row: 2, column: 'y_mm', value: 9000, message: '9000 mm is not inside the girder section' }]);
    expect(checked.allowed.commit).toBe(false);
    expect(checked.counts.girders).toMatchObject({ create: expect.any(Number) });
    // Nothing of the file is written by a check.
    expect(await testDb.db('structures').where({ district: 'West District' }).count<{ count: string }[]>('* as count')).toEqual([{ count: '0' }]);
  });

  it('names, in the check, a new span the file gives no girders', async () => {
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(readFileSync(path.join(__dirname, '../../data-import/samples/west-district-inventory.xlsx')) as unknown as ArrayBuffer);
    const spans = workbook.getWorksheet('spans')!;
    const indexColumn = (spans.getRow(1).values as unknown[]).indexOf('span_index');
    const extra = spans.addRow((spans.getRow(2).values as unknown[]).slice(1));
    extra.getCell(indexColumn).value = 9;
    const bytes = Buffer.from(await workbook.xlsx.writeBuffer());

    const checked = json<ImportDetail>(await upload('managerNetwork', bytes, 'west with an empty span.xlsx'));
    expect(checked.problems).toEqual([
      expect.objectContaining({ sheet: 'spans', row: extra.number, column: 'structure_number, span_index', message: 'a new span needs its girders (at least two) in the same file; this file gives it 0' }),
    ]);
  });

  it('lets an inspector import findings but not the inventory', async () => {
    const checked = json<ImportDetail>(await upload('inspectorSouth', csvOf(structureRow({ structure_number: 'BV-S-0921', district: 'South District' })), 'structures.csv'));
    expect(checked.problems).toEqual([expect.objectContaining({ row: 2, column: 'structure_number', message: expect.stringMatching(/may not import structures/) })]);
  });

  it('reads an XLSX by its sheets, each named after its template', async () => {
    const workbook = new ExcelJS.Workbook();
    const structures = workbook.addWorksheet('structures');
    structures.addRow(STRUCTURE_HEADERS.split(','));
    structures.addRow(structureRow({ structure_number: 'BV-C-0931' }).split(',').map((cell) => (cell !== '' && !Number.isNaN(Number(cell)) ? Number(cell) : cell === '' ? null : cell)));
    const other = workbook.addWorksheet('bridges');
    other.addRow(['anything']);
    other.addRow(['a value']);
    const bytes = Buffer.from(await workbook.xlsx.writeBuffer());
    const checked = json<ImportDetail>(await upload('raterCentral', bytes, 'central batch.xlsx'));
    expect(checked.fileKind).toBe('xlsx');
    expect(checked.counts).toEqual({ structures: { rows: 1, create: 1, update: 0, unchanged: 0, refused: 0, fileRows: 1 } });
    expect(checked.problems).toEqual([expect.objectContaining({ sheet: 'bridges', message: expect.stringMatching(/named after its template/) })]);
  });

  it('refuses what is not a spreadsheet by its content, whatever its name, and a CSV of no known template', async () => {
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex');
    const refused = await upload('raterCentral', png, 'structures.xlsx');
    expect(refused.status).toBe(415);
    expect(json<ErrorBody>(refused).error.details?.reason).toBe('unsupported_file');
    const unnamed = await upload('raterCentral', csvOf(structureRow({ structure_number: 'BV-C-0941' })), 'batch.csv');
    expect(unnamed.status).toBe(400);
    expect(json<ErrorBody>(unnamed).error.details?.fields?.map((field) => field.field)).toEqual(['template']);
    const chosen = await upload('raterCentral', csvOf(structureRow({ structure_number: 'BV-C-0941' })), 'batch.csv', { template: 'structures' });
    expect(chosen.status).toBe(201);
    expect((await clients.get('raterCentral')!.request('/api/imports', { multipart: new FormData() })).status).toBe(400);
  });

  it('refuses an upload past the size limit with 413, before reading it', async () => {
    const small = await startSignInTestBed(testDb.url, { IMPORT_MAX_BYTES: '2048' });
    try {
      const client = new SignInClient(small.server.url);
      await client.signInAs(STAFF.raterCentral);
      const rows = Array.from({ length: 40 }, (_, index) => structureRow({ structure_number: `BV-C-${String(950 + index).padStart(4, '0')}` }));
      const response = await upload('raterCentral', csvOf(...rows), 'structures.csv', {}, client);
      expect(response.status).toBe(413);
      expect(json<ErrorBody>(response).error.code).toBe('payload_too_large');
    } finally {
      await small.stop();
    }
  });
});

describe('imports API: committing a checked upload', () => {
  const BACKGROUND_FROM_BYTES = 60_000;
  const SAMPLES = path.join(__dirname, '../../data-import/samples');
  const sampleWorkbook = () => readFileSync(path.join(SAMPLES, 'west-district-inventory.xlsx'));
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const clients = new Map<Staff, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    await seedDemoConditions(testDb.db);
    // Files from 60 kB on are committed in the background: the samples stay in the request, the long files below go to the queue.
    bed = await startSignInTestBed(testDb.url, { IMPORT_BACKGROUND_FROM_BYTES: String(BACKGROUND_FROM_BYTES) });
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

  function upload(staff: Staff, bytes: Buffer | string, fileName: string) {
    const form = new FormData();
    form.append('file', new Blob([typeof bytes === 'string' ? bytes : new Uint8Array(bytes)]), fileName);
    return clients.get(staff)!.request('/api/imports', { multipart: form });
  }
  const step = (staff: Staff, checked: Pick<ImportDetail, 'id' | 'version'>, name: 'commit' | 'discard') =>
    clients.get(staff)!.request(`/api/imports/${checked.id}/${name}`, { json: { version: checked.version } });
  const westCounts = async () => {
    const [row] = await testDb.db('structures').where({ district: 'West District' }).count<{ count: string }[]>('* as count');
    return Number(row!.count);
  };

  it('writes the sample inventory in one go, through the inventory rules, and refuses the same file again', async () => {
    const checked = json<ImportDetail>(await upload('managerNetwork', sampleWorkbook(), 'west-district-inventory.xlsx'));
    expect(checked.problems).toEqual([]);
    expect(checked.counts.structures).toMatchObject({ create: 6 });
    expect(checked.allowed).toEqual({ commit: true, discard: true });
    // Only the uploader takes it further; a stale version is refused.
    expect((await step('raterCentral', checked, 'commit')).status).toBe(403);
    expect((await step('managerNetwork', { ...checked, version: checked.version + 1 }, 'commit')).status).toBe(409);

    const committed = await step('managerNetwork', checked, 'commit');
    expect(committed.status).toBe(200);
    expect(json<ImportDetail>(committed)).toMatchObject({ state: 'committed', committed: { by: 'Greer Ashdown' }, allowed: { commit: false, discard: false } });
    expect(await westCounts()).toBe(6);
    const spans = await testDb.db('spans').join('structures', 'structures.id', 'spans.structure_id').where('structures.district', 'West District').select('spans.id', 'spans.girder_count', 'spans.rerating_due_since');
    expect(spans.length).toBe(checked.counts.spans!.create);
    const girders = await testDb.db('girders').whereIn('span_id', spans.map((span) => span.id)).count<{ count: string }[]>('* as count');
    expect(Number(girders[0]!.count)).toBe(checked.counts.girders!.create);
    expect(spans.every((span) => span.girder_count >= 2 && span.rerating_due_since !== null)).toBe(true);
    const created = await testDb.db('audit_events').where({ action: 'structure.created' }).count<{ count: string }[]>('* as count');
    expect(Number(created[0]!.count)).toBe(6);
    const onMap = json<{ features: { properties: { district: string } }[] }>(await clients.get('raterCentral')!.request('/api/structures?district=West%20District'));
    expect(onMap.features).toHaveLength(6);

    const again = await upload('managerNetwork', sampleWorkbook(), 'copy of west.xlsx');
    expect(again.status).toBe(409);
    expect(json<ErrorBody>(again).error.message).toMatch(new RegExp(`import ${checked.id}`));
  });

  /** The sample workbook under other structure numbers (`BV-W-0101` → `renumber('BV-W-0101')`): a file of its own. */
  async function renumberedSample(renumber: (structureNumber: string) => string, edit: (workbook: ExcelJS.Workbook) => void = () => undefined): Promise<Buffer> {
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(sampleWorkbook() as unknown as ArrayBuffer);
    workbook.eachSheet((sheet) => {
      const numberColumn = (sheet.getRow(1).values as unknown[]).indexOf('structure_number');
      if (numberColumn > 0) sheet.getColumn(numberColumn).eachCell((cell, row) => row > 1 && (cell.value = renumber(String(cell.value))));
    });
    edit(workbook);
    return Buffer.from(await workbook.xlsx.writeBuffer());
  }
  const withPrefix = (prefix: string) => (structureNumber: string) => structureNumber.replace(/^BV-W-/, prefix);

  it('commits a check kept before checks kept their girders per span, counting them from the checked rows', async () => {
    const checked = json<ImportDetail>(await upload('managerNetwork', await renumberedSample(withPrefix('BV-V-')), 'west renumbered.xlsx'));
    expect(checked.problems).toEqual([]);
    const kept = await testDb.db('imports').where({ id: checked.id }).first('girders_per_span');
    expect(Object.values(kept.girders_per_span as Record<string, number>).reduce((sum, count) => sum + count, 0)).toBe(checked.counts.girders!.create);
    await testDb.db('imports').where({ id: checked.id }).update({ girders_per_span: null });

    expect((await step('managerNetwork', checked, 'commit')).status).toBe(200);
    const spans = await testDb.db('spans').join('structures', 'structures.id', 'spans.structure_id').where('structures.structure_number', 'like', 'BV-V-%').select('spans.id', 'spans.girder_count');
    expect(spans).toHaveLength(checked.counts.spans!.create);
    for (const span of spans) {
      const [girders] = await testDb.db('girders').where({ span_id: span.id }).count<{ count: string }[]>('* as count');
      expect(span.girder_count).toBe(Number(girders!.count));
    }
  });

  it('adds new girders and changes stored ones from the same girders sheet', async () => {
    const inventory = json<ImportDetail>(await upload('managerNetwork', await renumberedSample(withPrefix('BV-U-')), 'west as BV-U.xlsx'));
    expect((await step('managerNetwork', inventory, 'commit')).status).toBe(200);
    // The same file again with one structure under a new number (new girders), and stronger concrete in one stored girder.
    const strongerFirstGirder = (workbook: ExcelJS.Workbook) => {
      const girders = workbook.getWorksheet('girders')!;
      const strengthColumn = (girders.getRow(1).values as unknown[]).indexOf('concrete_strength_mpa');
      girders.getRow(2).getCell(strengthColumn).value = 55;
    };
    const file = await renumberedSample((number) => (number === 'BV-W-0108' ? 'BV-T-0108' : withPrefix('BV-U-')(number)), strongerFirstGirder);
    const checked = json<ImportDetail>(await upload('managerNetwork', file, 'west with a new bridge.xlsx'));
    expect(checked.problems).toEqual([]);
    const firstRow = (await new ExcelJS.Workbook().xlsx.load(file as unknown as ArrayBuffer)).getWorksheet('girders')!.getRow(2).values as unknown[];
    expect(firstRow.slice(1, 4)).toEqual(['BV-U-0101', 1, 1]);
    const newGirders = checked.counts.girders!.create;
    expect(newGirders).toBeGreaterThan(0);
    expect(checked.counts.girders).toMatchObject({ update: 1 });

    expect((await step('managerNetwork', checked, 'commit')).status).toBe(200);
    const girdersOf = (structureNumber: string) =>
      testDb.db('girders').join('spans', 'spans.id', 'girders.span_id').join('structures', 'structures.id', 'spans.structure_id').where('structures.structure_number', structureNumber).orderBy(['spans.span_index', 'girders.girder_number']).select('girders.concrete');
    expect((await girdersOf('BV-U-0101'))[0].concrete).toMatchObject({ strengthMpa: 55 });
    expect(await girdersOf('BV-T-0108')).toHaveLength(newGirders);
  });

  it('writes nothing when a fault stops a commit half way', async () => {
    const file = csvOf(structureRow({ structure_number: 'BV-C-0961' }), structureRow({ structure_number: 'BV-C-0962' }));
    const checked = json<ImportDetail>(await upload('raterCentral', file, 'structures.csv'));
    const user = toSignedInUser((await findUserBySubject(testDb.db, STAFF.raterCentral))!);
    await expect(
      commitImport({ db: testDb.db, user }, checked.id, checked.version, {
        afterRowsWritten: () => {
          throw new Error('the database went away');
        },
      }),
    ).rejects.toThrow('the database went away');
    expect(await testDb.db('structures').whereIn('structure_number', ['BV-C-0961', 'BV-C-0962']).first('id')).toBeUndefined();
    expect((await testDb.db('imports').where({ id: checked.id }).first('state')).state).toBe('checked');
  });

  it('lets exactly one of two commits of the same file win, and fails a commit the register has moved past', async () => {
    const file = csvOf(structureRow({ structure_number: 'BV-C-0971' }));
    const first = json<ImportDetail>(await upload('raterCentral', file, 'structures.csv'));
    const second = json<ImportDetail>(await upload('raterCentral', file, 'structures.csv'));
    const answers = await Promise.all([step('raterCentral', first, 'commit'), step('raterCentral', second, 'commit')]);
    const outcomes = answers.map((answer) => (answer.status === 200 ? json<ImportDetail>(answer).state : answer.status)).sort();
    expect(outcomes).toEqual([409, 'committed']);
    expect(await testDb.db('structures').where({ structure_number: 'BV-C-0971' }).count<{ count: string }[]>('* as count')).toEqual([{ count: '1' }]);

    // Checked while the structure was new; by the commit a manager had added it in a district the rater may not change.
    const late = json<ImportDetail>(await upload('raterCentral', csvOf(structureRow({ structure_number: 'BV-C-0972' })), 'structures.csv'));
    const added = await clients.get('managerNetwork')!.request('/api/structures', { json: { structureNumber: 'BV-C-0972', name: 'Added meanwhile', routeCarried: 'Route 1', featureCrossed: 'Creek', district: 'South District', longitude: -97.5, latitude: 38.5 } });
    expect(added.status).toBe(201);
    const failed = json<ImportDetail>(await step('raterCentral', late, 'commit'));
    expect(failed.state).toBe('failed');
    expect(failed.problems).toEqual([expect.objectContaining({ row: 2, message: expect.stringMatching(/South District/) })]);
    expect((await testDb.db('structures').where({ structure_number: 'BV-C-0972' }).first('name')).name).toBe('Added meanwhile');
  });

  /** A structures file of `count` new structures numbered from `first`, past the size from which commits run in the background. */
  function longStructuresFile(first: number, count: number): string {
    const rows = Array.from({ length: count }, (_, at) => structureRow({ structure_number: `BV-Q-${first + at}`, name: `Queued sample bridge number ${first + at} over the long creek` }));
    const file = csvOf(...rows);
    expect(file.length).toBeGreaterThan(BACKGROUND_FROM_BYTES);
    return file;
  }

  async function untilDone(staff: Staff, id: number): Promise<{ detail: ImportDetail; progressSeen: { done: number; total: number }[] }> {
    const progressSeen: { done: number; total: number }[] = [];
    for (let attempt = 0; attempt < 300; attempt += 1) {
      const detail = json<ImportDetail>(await clients.get(staff)!.request(`/api/imports/${id}`));
      if (detail.state !== 'committing') return { detail, progressSeen };
      progressSeen.push(detail.progress!);
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    throw new Error(`import ${id} is still committing after 30 s`);
  }

  it('commits a large file in a background job, showing its progress, and only once', async () => {
    const file = longStructuresFile(10_000, 600);
    const checked = json<ImportDetail>(await upload('raterCentral', file, 'structures.csv'));
    expect(checked).toMatchObject({ state: 'checked', problemCount: 0 });
    const queued = await step('raterCentral', checked, 'commit');
    expect(queued.status).toBe(202);
    expect(json<ImportDetail>(queued)).toMatchObject({ state: 'committing', progress: { total: 600 }, allowed: { commit: false, discard: false } });
    // While it is being written, a second commit of it is refused.
    expect((await step('raterCentral', json<ImportDetail>(queued), 'commit')).status).toBe(409);

    const { detail, progressSeen } = await untilDone('raterCentral', checked.id);
    expect(detail).toMatchObject({ state: 'committed', committed: { by: expect.any(String) }, progress: null });
    expect(progressSeen.every((progress) => progress.total === 600 && progress.done <= 600)).toBe(true);
    const [stored] = await testDb.db('structures').where('structure_number', 'like', 'BV-Q-1%').count<{ count: string }[]>('* as count');
    expect(Number(stored!.count)).toBe(600);
    const jobs = await testDb.db.raw("select state from pgboss.job where name = 'import-commit' and data->>'importId' = ?", [String(checked.id)]);
    expect(jobs.rows).toEqual([{ state: 'completed' }]);
  });

  it('fails a background commit the register has moved past, naming the row, and writes nothing of it', async () => {
    const file = longStructuresFile(20_000, 600);
    const checked = json<ImportDetail>(await upload('raterCentral', file, 'structures.csv'));
    // Meanwhile a manager adds the 300th structure in a district the rater may not change.
    const added = await clients.get('managerNetwork')!.request('/api/structures', { json: { structureNumber: 'BV-Q-20299', name: 'Added meanwhile', routeCarried: 'Route 1', featureCrossed: 'Creek', district: 'South District', longitude: -97.5, latitude: 38.5 } });
    expect(added.status).toBe(201);
    expect((await step('raterCentral', checked, 'commit')).status).toBe(202);
    const { detail } = await untilDone('raterCentral', checked.id);
    expect(detail.state).toBe('failed');
    expect(detail.problems).toEqual([expect.objectContaining({ row: 301, message: expect.stringMatching(/South District/) })]);
    const [stored] = await testDb.db('structures').where('structure_number', 'like', 'BV-Q-2%').count<{ count: string }[]>('* as count');
    expect(Number(stored!.count)).toBe(1);
  });

  it('sets a checked import aside for its uploader', async () => {
    const checked = json<ImportDetail>(await upload('raterCentral', csvOf(structureRow({ structure_number: 'BV-C-0981' })), 'structures.csv'));
    const discarded = await step('raterCentral', checked, 'discard');
    expect(json<ImportDetail>(discarded).state).toBe('discarded');
    expect((await step('raterCentral', json<ImportDetail>(discarded), 'commit')).status).toBe(409);
  });
});
