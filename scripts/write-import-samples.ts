/**
 * Writes the import samples (`data-import/samples/`) from the demo scenario's own rules, with no
 * database: a new, invented West District of the Bluestem Valley Regional Roads Authority (six
 * structures with their spans, girders and strand rows, built the way seeds/demo-inventory.ts
 * builds the demo's), findings and prior ratings on structures the demo already has, a US
 * customary copy of the spans and strand rows, and one workbook holding the four inventory
 * sheets. Run it after changing the samples or the demo's rules:
 * `node --import tsx scripts/write-import-samples.ts`. A test checks that the committed files
 * equal what this gives and that every sample imports.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import ExcelJS from 'exceljs';
import girderTypeCatalogue from '../seeds/data/girder-types.json';
import { demoStructures, seededRandom } from '../seeds/demo-structures';
import { IMPORT_TEMPLATES, siToUs, type ImportColumn, type ImportTemplateName } from '../shared/src/imports';

export const SAMPLES_FOLDER = path.resolve(__dirname, '..', 'data-import', 'samples');
export const WORKBOOK_FILE = 'west-district-inventory.xlsx';
export const INVENTORY_TEMPLATES = ['structures', 'spans', 'girders', 'strand-rows'] as const satisfies readonly ImportTemplateName[];

const SAMPLE_NOTE = 'Sample data, invented for the demo (data-import/samples).';

export type SampleCell = string | number | null;

/** One sample sheet: the template it follows, its header row and its rows, cells in header order. */
export interface SampleSheet {
  readonly template: ImportTemplateName;
  readonly headers: readonly string[];
  readonly rows: readonly (readonly SampleCell[])[];
}

/** A sample row by the template's SI headers; headers left out are empty cells. */
type SampleRecord = Readonly<Record<string, SampleCell>>;

/** Lays records out in the template's column order, refusing a header the template does not have. */
function sheetOf(template: ImportTemplateName, records: readonly SampleRecord[]): SampleSheet {
  const headers = IMPORT_TEMPLATES[template].columns.map((column) => column.header);
  for (const record of records) {
    const unknown = Object.keys(record).filter((header) => !headers.includes(header));
    if (unknown.length > 0) throw new Error(`${template} sample: no such column ${unknown.join(', ')}`);
  }
  return { template, headers, rows: records.map((record) => headers.map((header) => record[header] ?? null)) };
}

// ---------------------------------------------------------------------------------------------
// The West District: invented, west of the demo's four districts and inside the same state
// outline of the shipped basemap (the demo's districts lie between 99.5° W and 96.6° W).

const WEST_DISTRICT = {
  name: 'West District',
  code: 'W',
  /** West, south, east, north in degrees. */
  area: [-101.5, 37.7, -99.8, 39.4] as const,
  routes: ['Route 27', 'Route 40', 'County Road 508', 'County Road 533'],
  towns: ['Kessler', 'Prairie Vale', 'Dunmore'],
  crossings: ['Antelope Draw', 'Saltgrass Creek', 'Windmill Draw', 'Chalk Bluff Creek', 'Red Shale Creek', 'High Plains Grain Spur'],
};

/** The year the demo's condition rules count a bridge's age from (seeds/demo-conditions.ts). */
const DEMO_YEAR = 2026;

/** Six structures, numbered and placed the way seeds/demo-structures.ts numbers and places the demo's. */
function westDistrictStructures(): SampleRecord[] {
  const random = seededRandom(20261202);
  const between = (low: number, high: number) => low + (high - low) * random();
  const pick = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));
  const [west, south, east, north] = WEST_DISTRICT.area;
  return WEST_DISTRICT.crossings.map((crossing, index) => {
    const adt = Math.round(between(400, 18000) / 10) * 10;
    const yearBuilt = Math.round(between(1958, 2016));
    // The demo's condition rule: bridges over 25 and over 45 years old rate one and two lower.
    const age = DEMO_YEAR - yearBuilt;
    const ageLoss = age > 45 ? 2 : age > 25 ? 1 : 0;
    return {
      structure_number: `BV-${WEST_DISTRICT.code}-${String(101 + index * 7).padStart(4, '0')}`,
      name: `${crossing} Bridge near ${WEST_DISTRICT.towns[index % WEST_DISTRICT.towns.length]}`,
      route_carried: WEST_DISTRICT.routes[index % WEST_DISTRICT.routes.length]!,
      feature_crossed: crossing,
      district: WEST_DISTRICT.name,
      longitude_deg: Number(between(west, east).toFixed(5)),
      latitude_deg: Number(between(south, north).toFixed(5)),
      year_built: yearBuilt,
      adt,
      adtt: Math.round(adt * between(0.04, 0.22)),
      skew_deg: random() < 0.6 ? 0 : pick(1, 6) * 5,
      deck_condition: Math.max(3, pick(5, 8) - ageLoss),
      superstructure_condition: Math.max(3, pick(6, 8) - ageLoss),
      substructure_condition: Math.max(4, pick(6, 8) - ageLoss),
      condition_rated_on: `${DEMO_YEAR}-${String(pick(3, 10)).padStart(2, '0')}-${String(pick(1, 28)).padStart(2, '0')}`,
      status: 'open',
      notes: SAMPLE_NOTE,
    };
  });
}

// ---------------------------------------------------------------------------------------------
// Spans, girders and strand rows by the rules of seeds/demo-inventory.ts. That seed does not
// export them (they live inside its Knex entry point), so they are repeated here, in the same
// order of random draws, and used both for the West District and to replay the demo's own
// girders that the findings sample points at.

/** The demo's strand (seeds/demo-inventory.ts): 12.7 mm seven-wire strand, fpu 1860 MPa. */
const DEMO_STRAND = { strandAreaMm2: 98.7, strandDiameterMm: 12.7, fpuMpa: 1860, fpyMpa: 1674, epsMpa: 196500 };
const OVERHANG_MM = 900;
const BARRIER_FACE_TO_GIRDER_MM = 450;

export interface PlannedStrandRow {
  readonly rowId: string;
  readonly yMm: number;
  readonly count: number;
  readonly fpeMpa: number;
}

/** The spans of one structure: the demo gives all spans of a structure the same girders. */
export interface PlannedInventory {
  readonly structureNumber: string;
  readonly spanCount: number;
  readonly lengthM: number;
  readonly girderCount: number;
  readonly spacingMm: number;
  readonly girderTypeName: string;
  readonly concreteStrengthMpa: number;
  readonly strandRows: readonly PlannedStrandRow[];
}

/** The catalogue type the demo builds a span of this length with, shortest first. */
function girderTypeFor(lengthM: number): string {
  if (lengthM < 18) return 'AASHTO Type II I-girder';
  if (lengthM < 24) return 'AASHTO Type III I-girder';
  if (lengthM < 30) return 'AASHTO Type IV I-girder';
  return lengthM < 34 ? 'AASHTO-PCI BT-63 bulb-tee' : 'AASHTO-PCI BT-72 bulb-tee';
}

/** Two or three bottom rows at 50 mm pitch sized to the span, and the demo's harped row over 26 m. */
function strandRowsFor(lengthM: number, random: () => number): PlannedStrandRow[] {
  const bottomStrands = Math.round(8 + lengthM * 0.55 + random() * 4);
  const perRow = [Math.min(12, bottomStrands), Math.min(12, Math.max(bottomStrands - 12, 4))];
  if (bottomStrands > 24) perRow.push(bottomStrands - 24);
  const fpeMpa = Math.round(1080 + random() * 80);
  const rows = perRow.map((count, index) => ({ rowId: `r${index + 1}`, yMm: 50 + 50 * index, count, fpeMpa }));
  if (lengthM > 26) rows.push({ rowId: 'h1', yMm: 50 + 50 * perRow.length, count: 6, fpeMpa });
  return rows;
}

/** The demo's draws for one structure, spans 16 m up to `longestSpanM` long. */
function plannedInventory(structureNumber: string, random: () => number, longestSpanM: number): PlannedInventory {
  const spanCount = 2 + Math.floor(random() * 3);
  const lengthM = Math.round((16 + random() * (longestSpanM - 16)) * 2) / 2;
  const girderCount = 4 + Math.floor(random() * 4);
  const spacingMm = Math.round((2100 + random() * 600) / 50) * 50;
  const concreteStrengthMpa = Math.round(41 + random() * 14);
  const strandRows = strandRowsFor(lengthM, random);
  return { structureNumber, spanCount, lengthM, girderCount, spacingMm, girderTypeName: girderTypeFor(lengthM), concreteStrengthMpa, strandRows };
}

/** The girders the demo scenario gives its structures on a new database, replayed from seeds/demo-inventory.ts's rules. */
export function demoInventory(): PlannedInventory[] {
  const random = seededRandom(20261215);
  return demoStructures().map((structure) => plannedInventory(structure.structure_number, random, 36));
}

/**
 * The West District's inventory. Its spans stay at 26 m or less, where the demo's rules harp no
 * strands: the import has no column for a harped profile (data-import/README.md).
 */
function westDistrictInventory(structures: readonly SampleRecord[]): PlannedInventory[] {
  const random = seededRandom(20261203);
  return structures.map((structure) => plannedInventory(String(structure['structure_number']), random, 26));
}

function spanRecords(inventory: readonly PlannedInventory[]): SampleRecord[] {
  return inventory.flatMap((planned) =>
    Array.from({ length: planned.spanCount }, (_, index) => ({
      structure_number: planned.structureNumber,
      span_index: index + 1,
      span_length_m: planned.lengthM,
      girder_spacing_mm: planned.spacingMm,
      overhang_mm: OVERHANG_MM,
      roadway_width_mm: (planned.girderCount - 1) * planned.spacingMm + 2 * OVERHANG_MM - 2 * BARRIER_FACE_TO_GIRDER_MM,
      barrier_face_to_girder_mm: BARRIER_FACE_TO_GIRDER_MM,
      deck_thickness_mm: 200,
      haunch_mm: 25,
      wearing_surface_thickness_mm: 60,
      wearing_surface_unit_weight_kn_m3: 23,
      wearing_surface_measured: 'no',
      wearing_surface_kind: 'overlay',
      barrier_loads_kn_m: '7.5;7.5',
    })),
  );
}

/** Every girder of every span of every structure, with its structure's plan. */
function eachGirder(inventory: readonly PlannedInventory[]): { planned: PlannedInventory; spanIndex: number; girderNumber: number }[] {
  return inventory.flatMap((planned) =>
    Array.from({ length: planned.spanCount }, (_, spanOffset) =>
      Array.from({ length: planned.girderCount }, (_, girderOffset) => ({ planned, spanIndex: spanOffset + 1, girderNumber: girderOffset + 1 })),
    ).flat(),
  );
}

function girderRecords(inventory: readonly PlannedInventory[]): SampleRecord[] {
  return eachGirder(inventory).map(({ planned, spanIndex, girderNumber }) => ({
    structure_number: planned.structureNumber,
    span_index: spanIndex,
    girder_number: girderNumber,
    position: girderNumber === 1 || girderNumber === planned.girderCount ? 'exterior' : 'interior',
    girder_type: catalogueTypeName(planned.girderTypeName),
    concrete_strength_mpa: planned.concreteStrengthMpa,
    concrete_basis: 'cylinder',
    concrete_unit_weight_kn_m3: 24,
    deck_concrete_strength_mpa: 30,
    deck_concrete_basis: 'cylinder',
    tensioning: 'pre',
  }));
}

/** The name, checked against the published girder types the demo loads (seeds/data/girder-types.json). */
function catalogueTypeName(name: string): string {
  if (!girderTypeCatalogue.types.some((type) => type.name === name)) throw new Error(`${name} is not in seeds/data/girder-types.json`);
  return name;
}

function strandRowRecords(inventory: readonly PlannedInventory[]): SampleRecord[] {
  return eachGirder(inventory).flatMap(({ planned, spanIndex, girderNumber }) =>
    planned.strandRows.map((row) => ({
      structure_number: planned.structureNumber,
      span_index: spanIndex,
      girder_number: girderNumber,
      row_id: row.rowId,
      y_mm: row.yMm,
      strand_count: row.count,
      strand_area_mm2: DEMO_STRAND.strandAreaMm2,
      strand_diameter_mm: DEMO_STRAND.strandDiameterMm,
      fpu_mpa: DEMO_STRAND.fpuMpa,
      fpy_mpa: DEMO_STRAND.fpyMpa,
      eps_mpa: DEMO_STRAND.epsMpa,
      fpe_mpa: row.fpeMpa,
      bonded: 'yes',
    })),
  );
}

// ---------------------------------------------------------------------------------------------
// Findings and prior ratings on structures the demo already has. Every demo structure has at
// least two spans of at least four girders, 16 m or longer, whose bottom row r1 holds 12 strands
// (indices 0…11) and whose row r2 holds at least 4; the test checks each row against the replay.

const sampleNote = (text: string) => `${text} ${SAMPLE_NOTE}`;

const FINDINGS: readonly SampleRecord[] = [
  { structure_number: 'BV-C-0143', span_index: 1, girder_number: 1, inspected_on: '2026-11-24', kind: 'spall', severity: 'moderate', from_m: 4.0, to_m: 5.2, spall_depth_mm: 35, spall_width_mm: 150, notes: sampleNote('Spall at the bottom flange corner, strands showing.') },
  { structure_number: 'BV-C-0143', span_index: 1, girder_number: 1, inspected_on: '2026-11-24', kind: 'exposed-strands', severity: 'moderate', from_m: 4.0, to_m: 5.2, strand_row_id: 'r1', strand_indices: '0;1', notes: sampleNote('Two corner strands exposed in the spall.') },
  { structure_number: 'BV-C-0143', span_index: 2, girder_number: 3, inspected_on: '2026-11-24', kind: 'crack', severity: 'minor', from_m: 0, to_m: 0.9, crack_width_mm: 0.25, notes: sampleNote('Web cracks near the bearing.') },
  { structure_number: 'BV-E-0108', span_index: 1, girder_number: 4, inspected_on: '2026-11-25', kind: 'strand-section-loss', severity: 'severe', from_m: 7.5, to_m: 9.0, strand_row_id: 'r1', strand_indices: '10;11', loss_fraction: 0.2, notes: sampleNote('Pitting on two strands under a leaking joint, about a fifth of their area.') },
  { structure_number: 'BV-E-0108', span_index: 1, girder_number: 4, inspected_on: '2026-11-25', kind: 'broken-wires', severity: 'moderate', from_m: 8.0, to_m: 8.4, strand_row_id: 'r2', strand_count: 1, broken_wires: 2, notes: sampleNote('Two wires broken on one strand of the second row.') },
  { structure_number: 'BV-N-0157', span_index: 2, girder_number: 2, inspected_on: '2026-11-26', kind: 'deck-loss', severity: 'moderate', from_m: 6.0, to_m: 8.5, deck_loss_mm: 30, notes: sampleNote('Deck soffit delaminated and fallen over the girder.') },
];

const PRIOR_RATINGS: readonly SampleRecord[] = [
  { structure_number: 'BV-N-0115', lowest_legal_rf: 1.31, design_inventory_rf: 1.02, approved_on: '2017-05-19', source_note: sampleNote('Rating report of May 2017, file BV-R-0115.') },
  { structure_number: 'BV-C-0101', lowest_legal_rf: 1.48, design_inventory_rf: 1.12, approved_on: '2015-09-03', source_note: sampleNote('Rating report of September 2015, file BV-R-0201.') },
  { structure_number: 'BV-C-0171', lowest_legal_rf: 1.22, approved_on: '2012-04-26', source_note: sampleNote('Legal loads only, from the 2012 posting review.') },
  { structure_number: 'BV-E-0143', design_inventory_rf: 0.97, approved_on: '2019-11-14', source_note: sampleNote('Design load check of the 2019 deck replacement.') },
  { structure_number: 'BV-S-0115', span_index: 1, lowest_legal_rf: 1.16, design_inventory_rf: 0.91, approved_on: '2018-06-07', source_note: sampleNote('Span 1 of the June 2018 rating report.') },
  { structure_number: 'BV-S-0115', span_index: 2, lowest_legal_rf: 1.19, design_inventory_rf: 0.93, approved_on: '2018-06-07', source_note: sampleNote('Span 2 of the June 2018 rating report.') },
];

// ---------------------------------------------------------------------------------------------
// US customary copies: the same rows under the US headers, converted with units.ts and rounded
// to seven significant digits (about 1 part in 10⁷, far below any value's own precision).

const US_SIGNIFICANT_DIGITS = 7;
/** A folder of their own, so that each copy keeps its template's file name, which an upload tells the template by. */
const US_CUSTOMARY_FOLDER = 'us-customary';

function inUsUnits(column: ImportColumn, cell: SampleCell): SampleCell {
  if (column.us === null || cell === null) return cell;
  const toUs = (value: number) => Number(siToUs(column, value).toPrecision(US_SIGNIFICANT_DIGITS));
  if (typeof cell === 'number') return toUs(cell);
  return cell.split(';').map((item) => toUs(Number(item))).join(';');
}

/** The sheet with every measured column under its US customary header. */
function usCustomaryCopy(sheet: SampleSheet): SampleSheet {
  const columns = IMPORT_TEMPLATES[sheet.template].columns;
  return {
    template: sheet.template,
    headers: columns.map((column) => column.us?.header ?? column.header),
    rows: sheet.rows.map((row) => row.map((cell, index) => inUsUnits(columns[index]!, cell))),
  };
}

// ---------------------------------------------------------------------------------------------

export interface ImportSamples {
  /** By path in data-import/samples/. */
  readonly csvFiles: ReadonlyMap<string, SampleSheet>;
  /** The US customary copies, by path, with the path of the SI sample each copies. */
  readonly usCopies: ReadonlyMap<string, string>;
  /** The sheets of the inventory workbook, one per inventory template, named after it. */
  readonly workbookSheets: readonly SampleSheet[];
}

/** Every sample, built from the demo's rules. */
export function importSamples(): ImportSamples {
  const structures = westDistrictStructures();
  const inventory = westDistrictInventory(structures);
  const inventorySheets = {
    structures: sheetOf('structures', structures),
    spans: sheetOf('spans', spanRecords(inventory)),
    girders: sheetOf('girders', girderRecords(inventory)),
    'strand-rows': sheetOf('strand-rows', strandRowRecords(inventory)),
  };
  const usCopies = new Map([
    [`${US_CUSTOMARY_FOLDER}/spans.csv`, 'spans.csv'],
    [`${US_CUSTOMARY_FOLDER}/strand-rows.csv`, 'strand-rows.csv'],
  ]);
  const csvFiles = new Map<string, SampleSheet>([
    ...INVENTORY_TEMPLATES.map((template): [string, SampleSheet] => [`${template}.csv`, inventorySheets[template]]),
    ['findings.csv', sheetOf('findings', FINDINGS)],
    ['prior-ratings.csv', sheetOf('prior-ratings', PRIOR_RATINGS)],
  ]);
  for (const [usFile, siFile] of usCopies) csvFiles.set(usFile, usCustomaryCopy(csvFiles.get(siFile)!));
  return { csvFiles, usCopies, workbookSheets: INVENTORY_TEMPLATES.map((template) => inventorySheets[template]) };
}

/** A CSV field, quoted when it holds a comma, a quote or a line break (RFC 4180, as templates.ts writes them). */
function csvField(cell: SampleCell): string {
  const text = cell === null ? '' : String(cell);
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** The sheet as CSV text with CRLF line ends, like the templates. */
export function sampleCsv(sheet: SampleSheet): string {
  return [sheet.headers, ...sheet.rows].map((cells) => cells.map(csvField).join(',')).join('\r\n') + '\r\n';
}

/** The inventory workbook, formatted like the XLSX templates (shared/src/imports/templates.ts). */
export function sampleWorkbook(sheets: readonly SampleSheet[]): ExcelJS.Workbook {
  const workbook = new ExcelJS.Workbook();
  // A fixed date keeps the workbook's properties the same on every run.
  workbook.created = workbook.modified = new Date('2026-12-01T00:00:00Z');
  for (const sample of sheets) {
    const sheet = workbook.addWorksheet(sample.template);
    sheet.addRow([...sample.headers]).font = { bold: true };
    for (const row of sample.rows) sheet.addRow([...row]);
    IMPORT_TEMPLATES[sample.template].columns.forEach((column, index) => {
      const sheetColumn = sheet.getColumn(index + 1);
      sheetColumn.width = Math.max(12, column.header.length + 2);
      // Text columns keep what is typed: a structure number stays text, a date stays YYYY-MM-DD.
      if (column.type !== 'number' && column.type !== 'whole-number') sheetColumn.numFmt = '@';
    });
  }
  return workbook;
}

async function writeSamples(): Promise<void> {
  const samples = importSamples();
  for (const [filePath, sheet] of samples.csvFiles) {
    mkdirSync(path.dirname(path.join(SAMPLES_FOLDER, filePath)), { recursive: true });
    writeFileSync(path.join(SAMPLES_FOLDER, filePath), sampleCsv(sheet));
  }
  await sampleWorkbook(samples.workbookSheets).xlsx.writeFile(path.join(SAMPLES_FOLDER, WORKBOOK_FILE));
  console.log(`wrote ${samples.csvFiles.size} CSV samples and ${WORKBOOK_FILE} to ${path.relative(process.cwd(), SAMPLES_FOLDER)}`);
}

if (require.main === module) {
  writeSamples().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
