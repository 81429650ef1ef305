import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import ExcelJS from 'exceljs';
import type { Polygon } from 'geojson';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import { readRows, type ImportRow } from '../../../backend/src/imports/readers/read-rows';
import girderTypeCatalogue from '../../../seeds/data/girder-types.json';
import { demoStructures } from '../../../seeds/demo-structures';
import {
  demoInventory,
  importSamples,
  INVENTORY_TEMPLATES,
  sampleCsv,
  SAMPLES_FOLDER,
  WORKBOOK_FILE,
  type SampleSheet,
} from '../../../scripts/write-import-samples';
import type { ImportTemplateName } from './columns';
import { convertRow, readHeaders, type ImportProblem } from './rows';
import { checkUpload, type AnyConvertedRow } from './upload-checks';

const REGENERATE = 'run `node --import tsx scripts/write-import-samples.ts` and commit the result';
const samples = importSamples();
const sampleFiles = [...samples.csvFiles.keys()];
const samplePath = (fileName: string) => path.join(SAMPLES_FOLDER, fileName);
const templateOfCsv = (fileName: string) => samples.csvFiles.get(fileName)!.template;

interface ReadUpload {
  readonly rows: readonly AnyConvertedRow[];
  readonly problems: readonly ImportProblem[];
  /** Data rows read, converted or not. */
  readonly rowCount: number;
}

/** A file's data rows as the server's import file readers give them. */
async function readRowsOf(fileName: string): Promise<ImportRow[]> {
  const rows: ImportRow[] = [];
  for await (const row of readRows(samplePath(fileName))) rows.push(row);
  return rows;
}

/**
 * Reads sample files as the server does (the import file readers, then the shared header and row
 * checks) into one upload: every converted row, and every header or row problem.
 */
async function readUpload(files: readonly { fileName: string; templateOf: (sheet: string) => ImportTemplateName }[]): Promise<ReadUpload> {
  const converted: AnyConvertedRow[] = [];
  const problems: ImportProblem[] = [];
  let rowCount = 0;
  for (const { fileName, templateOf } of files) {
    const rowsBySheet = new Map<string, ImportRow[]>();
    for (const row of await readRowsOf(fileName)) rowsBySheet.set(row.sheet, [...(rowsBySheet.get(row.sheet) ?? []), row]);
    for (const [sheet, rows] of rowsBySheet) {
      const template = templateOf(sheet);
      const headers = readHeaders(template, sheet, Object.keys(rows[0]!.cells));
      problems.push(...headers.problems);
      for (const row of rows) {
        const result = convertRow(template, headers, row);
        if (result.ok) converted.push(result.row as AnyConvertedRow);
        else problems.push(...result.problems);
      }
      rowCount += rows.length;
    }
  }
  return { rows: converted, problems, rowCount };
}

const csvUpload = (...fileNames: string[]) => readUpload(fileNames.map((fileName) => ({ fileName, templateOf: () => templateOfCsv(fileName) })));
const workbookUpload = () => readUpload([{ fileName: WORKBOOK_FILE, templateOf: (sheet) => sheet as ImportTemplateName }]);
const inventoryCsvFiles = INVENTORY_TEMPLATES.map((template) => `${template}.csv`);
const rowsIn = (sheets: readonly SampleSheet[]) => sheets.reduce((count, sheet) => count + sheet.rows.length, 0);

describe('the committed samples equal what scripts/write-import-samples.ts gives', () => {
  it('data-import/samples holds exactly the samples the script writes', () => {
    const files = readdirSync(SAMPLES_FOLDER, { recursive: true, withFileTypes: true }).filter((entry) => entry.isFile());
    const paths = files.map((file) => path.relative(SAMPLES_FOLDER, path.join(file.parentPath, file.name)).split(path.sep).join('/'));
    expect({ files: paths.sort(), hint: REGENERATE }).toEqual({ files: [...sampleFiles, WORKBOOK_FILE].sort(), hint: REGENERATE });
  });

  it.each(sampleFiles)('data-import/samples/%s', (fileName) => {
    const committed = readFileSync(samplePath(fileName), 'utf8');
    expect({ file: committed, hint: REGENERATE }).toEqual({ file: sampleCsv(samples.csvFiles.get(fileName)!), hint: REGENERATE });
  });

  it(`data-import/samples/${WORKBOOK_FILE}: its sheets read back with exceljs hold the inventory samples`, async () => {
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.readFile(samplePath(WORKBOOK_FILE));
    expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual([...INVENTORY_TEMPLATES]);
    for (const expected of samples.workbookSheets) {
      const sheet = workbook.getWorksheet(expected.template)!;
      const cellsOf = (rowNumber: number) => expected.headers.map((_, index) => sheet.getRow(rowNumber).getCell(index + 1).value ?? null);
      const readBack = Array.from({ length: sheet.rowCount }, (_, index) => cellsOf(index + 1));
      expect({ sheet: expected.template, rows: readBack, hint: REGENERATE }).toEqual({ sheet: expected.template, rows: [expected.headers, ...expected.rows], hint: REGENERATE });
    }
  });
});

describe('every sample imports with the shared row checks', () => {
  it.each(sampleFiles)('%s: the header row is known and every row converts', async (fileName) => {
    const upload = await csvUpload(fileName);
    expect(upload.problems).toEqual([]);
    expect(upload.rows).toHaveLength(samples.csvFiles.get(fileName)!.rows.length);
  });

  it('the West District CSV files, uploaded together, hold every structure, span and girder they refer to', async () => {
    const upload = await csvUpload(...inventoryCsvFiles);
    expect(upload.problems).toEqual([]);
    const check = checkUpload(upload.rows);
    expect(check.problems).toEqual([]);
    expect(check.mustExist).toEqual({ structures: [], spans: [], girders: [] });
    expect(check.strandRowsByGirder.size).toBe(samples.csvFiles.get('girders.csv')!.rows.length);
  });

  it(`${WORKBOOK_FILE}: one sheet per inventory template, every row converts and every reference is in the workbook`, async () => {
    const upload = await workbookUpload();
    expect(upload.problems).toEqual([]);
    expect(upload.rowCount).toBe(rowsIn(samples.workbookSheets));
    const check = checkUpload(upload.rows);
    expect(check.problems).toEqual([]);
    expect(check.mustExist).toEqual({ structures: [], spans: [], girders: [] });
  });

  it('findings name girders, strand rows and places the demo scenario has', async () => {
    const upload = await csvUpload('findings.csv');
    const check = checkUpload(upload.rows);
    expect(check.problems).toEqual([]);
    expect(check.mustExist.structures).toEqual([]);
    expect(check.mustExist.spans).toEqual([]);
    expect(check.mustExist.girders).not.toHaveLength(0);

    const demo = new Map(demoInventory().map((planned) => [planned.structureNumber, planned]));
    const misplaced: string[] = [];
    for (const row of upload.rows) {
      if (row.template !== 'findings') throw new Error(`findings.csv gave a ${row.template} row`);
      const { structureNumber, spanIndex, girderNumber, finding } = row.body;
      const at = `row ${row.rowNumber}`;
      const planned = demo.get(structureNumber);
      if (planned === undefined) {
        misplaced.push(`${at}: ${structureNumber} is not a demo structure`);
        continue;
      }
      if (spanIndex > planned.spanCount) misplaced.push(`${at}: ${structureNumber} has ${planned.spanCount} spans`);
      if (girderNumber > planned.girderCount) misplaced.push(`${at}: ${structureNumber} has ${planned.girderCount} girders a span`);
      if (finding.toM > planned.lengthM) misplaced.push(`${at}: the span is ${planned.lengthM} m long`);
      if (finding.strands === null) continue;
      const strandRow = planned.strandRows.find((candidate) => candidate.rowId === finding.strands!.rowId);
      if (strandRow === undefined) {
        misplaced.push(`${at}: the girders have no strand row ${finding.strands.rowId}`);
        continue;
      }
      const outside = (finding.strands.strands ?? []).filter((index) => index >= strandRow.count);
      if (outside.length > 0) misplaced.push(`${at}: row ${strandRow.rowId} has strands 0…${strandRow.count - 1}, not ${outside.join(', ')}`);
      if ((finding.strands.count ?? 0) > strandRow.count) misplaced.push(`${at}: row ${strandRow.rowId} has ${strandRow.count} strands`);
    }
    expect(misplaced).toEqual([]);
  });

  it('prior ratings are of demo structures and spans', async () => {
    const upload = await csvUpload('prior-ratings.csv');
    const check = checkUpload(upload.rows);
    expect(check.problems).toEqual([]);
    const demoNumbers = new Set(demoStructures().map((structure) => structure.structure_number));
    expect(check.mustExist.structures.filter((structureNumber) => !demoNumbers.has(structureNumber))).toEqual([]);
    const spanCounts = new Map(demoInventory().map((planned) => [planned.structureNumber, planned.spanCount]));
    expect(check.mustExist.spans.filter((span) => span.spanIndex > (spanCounts.get(span.structureNumber) ?? 0))).toEqual([]);
    expect(check.mustExist.structures.length + check.mustExist.spans.length).toBe(upload.rows.length);
  });
});

describe('the West District is new to the demo scenario and on its map', () => {
  const westStructures = samples.csvFiles.get('structures.csv')!;
  const cell = (row: readonly unknown[], header: string) => row[westStructures.headers.indexOf(header)];

  it('adds structure numbers and a district the demo does not have', () => {
    const demo = demoStructures();
    const demoNumbers = new Set(demo.map((structure) => structure.structure_number));
    expect(westStructures.rows.map((row) => cell(row, 'structure_number')).filter((number) => demoNumbers.has(number as string))).toEqual([]);
    const districts = new Set(westStructures.rows.map((row) => cell(row, 'district')));
    expect([...districts]).toEqual(['West District']);
    expect(demo.some((structure) => structure.district === 'West District')).toBe(false);
  });

  it('places every structure inside the state outline the demo lies in (us-atlas states-10m, FIPS 20)', () => {
    // The same outline the demo scenario's API test holds its structures to.
    const atlas = require('us-atlas/states-10m.json') as Topology<{ states: GeometryCollection }>;
    const outline = feature(atlas, atlas.objects.states).features.find((state) => state.id === '20')!.geometry as Polygon;
    const outside = westStructures.rows.filter((row) => !insidePolygon(outline, cell(row, 'longitude_deg') as number, cell(row, 'latitude_deg') as number));
    expect(outside).toEqual([]);
  });

  it('builds its girders of the published girder types the demo loads', () => {
    const girders = samples.csvFiles.get('girders.csv')!;
    const names = new Set(girders.rows.map((row) => row[girders.headers.indexOf('girder_type')]));
    const catalogue = new Set(girderTypeCatalogue.types.map((type) => type.name));
    expect([...names].filter((name) => !catalogue.has(name as string))).toEqual([]);
  });
});

/** Even-odd rule over the polygon's rings (an outer ring and any holes), in degrees. */
function insidePolygon(polygon: Polygon, longitude: number, latitude: number): boolean {
  let inside = false;
  for (const ring of polygon.coordinates) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const [xi, yi] = ring[i]!;
      const [xj, yj] = ring[j]!;
      if (yi! > latitude !== yj! > latitude && longitude < ((xj! - xi!) * (latitude - yi!)) / (yj! - yi!) + xi!) inside = !inside;
    }
  }
  return inside;
}

/** Numbers to six significant digits: the US copies are written to seven, so back in SI they agree to six. */
function toSixDigits(value: unknown): unknown {
  if (typeof value === 'number') return Number(value.toPrecision(6));
  if (Array.isArray(value)) return value.map(toSixDigits);
  if (value !== null && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([key, item]) => [key, toSixDigits(item)]));
  return value;
}

describe('the US customary copies', () => {
  it.each([...samples.usCopies])('%s converts to the same SI bodies as %s', async (usFile, siFile) => {
    const [us, si] = await Promise.all([csvUpload(usFile), csvUpload(siFile)]);
    expect(us.problems).toEqual([]);
    expect(us.rows.map((row) => toSixDigits(row.body))).toEqual(si.rows.map((row) => toSixDigits(row.body)));
  });

  it('us-customary/spans.csv: the first span in SI by the published factors (hand check from the definitions in units.ts)', async () => {
    const usCells = (await readRowsOf('us-customary/spans.csv'))[0]!.cells;
    const [usRow] = (await csvUpload('us-customary/spans.csv')).rows;
    if (usRow?.template !== 'spans') throw new Error('us-customary/spans.csv gave no span');
    const { span } = usRow.body;
    // 1 ft = 0.3048 m, 1 in = 25.4 mm, 1 kip = 4.448222 kN, 1 lbf = 4.448222 N.
    expect(span.lengthM).toBeCloseTo(Number(usCells['span_length_ft']) * 0.3048, 9);
    expect(span.girderSpacingMm).toBeCloseTo(Number(usCells['girder_spacing_in']) * 25.4, 9);
    expect(span.roadwayWidthMm).toBeCloseTo(Number(usCells['roadway_width_ft']) * 304.8, 9);
    expect(span.barriers![0]!.loadKnM).toBeCloseTo((Number(String(usCells['barrier_loads_kip_ft']).split(';')[0]) * 4.448222) / 0.3048, 9);
    expect(span.wearingSurface!.unitWeightKnM3).toBeCloseTo((Number(usCells['wearing_surface_unit_weight_pcf']) * 4.448222e-3) / 0.3048 ** 3, 9);
    // And those are the SI sample's values, to the seven digits the copy is written with.
    const siCells = (await readRowsOf('spans.csv'))[0]!.cells;
    expect(span.lengthM).toBeCloseTo(Number(siCells['span_length_m']), 4);
    expect(span.girderSpacingMm).toBeCloseTo(Number(siCells['girder_spacing_mm']), 2);
  });

  it('us-customary/strand-rows.csv: the first strand row in SI by the published factors (hand check from the definitions in units.ts)', async () => {
    const usCells = (await readRowsOf('us-customary/strand-rows.csv'))[0]!.cells;
    const [usRow] = (await csvUpload('us-customary/strand-rows.csv')).rows;
    if (usRow?.template !== 'strand-rows') throw new Error('us-customary/strand-rows.csv gave no strand row');
    const { strandRow } = usRow.body;
    // 1 in = 25.4 mm, 1 ksi = 6.894757 MPa.
    expect(strandRow.strandAreaMm2).toBeCloseTo(Number(usCells['strand_area_in2']) * 25.4 ** 2, 9);
    expect(strandRow.strandDiameterMm).toBeCloseTo(Number(usCells['strand_diameter_in']) * 25.4, 9);
    expect(strandRow.fpuMpa).toBeCloseTo(Number(usCells['fpu_ksi']) * 6.894757, 9);
    expect(strandRow.epsMpa).toBeCloseTo(Number(usCells['eps_ksi']) * 6.894757, 9);
  });
});
