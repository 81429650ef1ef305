import { stat } from 'node:fs/promises';
import ExcelJS from 'exceljs';
import { seededRandom } from '../../seeds/demo-structures';
import { inventedGirderRow, inventedSpanRow, inventedStrandRows, type InventedSpans } from '../../scripts/lib/invented-inventory-rows';
import { IMPORT_TEMPLATES, type ImportTemplateName } from '../../shared/src';

/**
 * The import benchmark's workbook: an invented extension of the demo authority's network in the
 * import templates' format (shared/src/imports/columns.ts), one sheet per inventory template named
 * after it, laid out as the XLSX templates and data-import/samples are — the template's every
 * column in its order, bold headers, text columns formatted as text. The values follow the rules
 * scripts/write-import-samples.ts and seeds/demo-inventory.ts build the demo with; the fixed seed
 * gives the same file on every machine.
 */

/** Every structure of the file has this many spans, and every span this many girders. */
export const SPANS_PER_STRUCTURE = 5;
export const GIRDERS_PER_SPAN = 10;
export const GIRDERS_PER_STRUCTURE = SPANS_PER_STRUCTURE * GIRDERS_PER_SPAN;

/** The sheets of the file, in the order they are written. */
export const BENCH_IMPORT_SHEETS = ['structures', 'spans', 'girders', 'strand-rows'] as const satisfies readonly ImportTemplateName[];
export type BenchImportSheet = (typeof BENCH_IMPORT_SHEETS)[number];

/**
 * The demo's four districts (seeds/demo-structures.ts), which the demo's staff have rights in: the
 * benchmark's structures are spread over them in turn, placed inside each district's area.
 */
const DEMO_DISTRICTS = [
  { name: 'North District', code: 'N', area: [-99.5, 38.9, -97.5, 39.5], routes: ['Route 9', 'Route 24', 'County Road 110', 'County Road 131'], towns: ['Harlow', 'Wendt', 'Osgood'] },
  { name: 'Central District', code: 'C', area: [-99.5, 38.2, -97.8, 38.85], routes: ['Route 4', 'Route 56', 'County Road 205', 'County Road 240'], towns: ['Marden', 'Tillby', 'Carrow'] },
  { name: 'South District', code: 'S', area: [-99.5, 37.55, -97.5, 38.15], routes: ['Route 61', 'Route 96', 'County Road 318', 'County Road 342'], towns: ['Fenwick', 'Aldis', 'Brisco'] },
  { name: 'East District', code: 'E', area: [-97.4, 37.6, -96.6, 39.4], routes: ['Route 15', 'Route 77', 'County Road 412', 'County Road 455'], towns: ['Quarry Hill', 'Lanning', 'Ostrow'] },
] as const;

const CROSSINGS = ['Clearwater Draw', 'Badger Creek', 'Switchgrass Run', 'Stony Ford', 'Larkspur Branch', 'Buffalo Wallow Creek', 'Grainline Spur Railway', 'Hackberry Slough'];

/** The demo numbers its structures 0101–0178 in each district; the benchmark's start at 2001, clear of them. */
const FIRST_STRUCTURE_NUMBER = 2001;
const NOTE = 'Benchmark data, invented (bench/import-girders.bench.ts).';

type Cell = string | number | null;
/** A row by the template's SI headers; headers left out are empty cells. */
type SheetRecord = Readonly<Record<string, Cell>>;

/** What one structure of the file is built from: the demo gives all spans of a structure the same girders. */
interface PlannedStructure extends InventedSpans {
  readonly record: SheetRecord;
  readonly strandCount: number;
}

function plannedStructures(count: number): PlannedStructure[] {
  const random = seededRandom(20270301);
  const between = (low: number, high: number) => low + (high - low) * random();
  const whole = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));
  return Array.from({ length: count }, (_, index) => {
    const district = DEMO_DISTRICTS[index % DEMO_DISTRICTS.length]!;
    const [west, south, east, north] = district.area;
    const structureNumber = `BV-${district.code}-${String(FIRST_STRUCTURE_NUMBER + Math.floor(index / DEMO_DISTRICTS.length)).padStart(4, '0')}`;
    const crossing = CROSSINGS[whole(0, CROSSINGS.length - 1)]!;
    const adt = Math.round(between(400, 18000) / 10) * 10;
    // Spans of 26 m or less, where the demo harps no strands: the import has no column for a harped profile.
    const lengthM = Math.round(between(16, 26) * 2) / 2;
    return {
      structureNumber,
      record: {
        structure_number: structureNumber,
        name: `${crossing} Bridge near ${district.towns[index % district.towns.length]}`,
        route_carried: district.routes[whole(0, district.routes.length - 1)]!,
        feature_crossed: crossing,
        district: district.name,
        longitude_deg: Number(between(west, east).toFixed(5)),
        latitude_deg: Number(between(south, north).toFixed(5)),
        year_built: whole(1958, 2016),
        adt,
        adtt: Math.round(adt * between(0.04, 0.22)),
        skew_deg: random() < 0.6 ? 0 : whole(1, 6) * 5,
        deck_condition: whole(4, 8),
        superstructure_condition: whole(4, 8),
        substructure_condition: whole(4, 8),
        condition_rated_on: `2026-${String(whole(3, 10)).padStart(2, '0')}-${String(whole(1, 28)).padStart(2, '0')}`,
        status: 'open',
        notes: NOTE,
      },
      lengthM,
      spacingMm: Math.round(between(2100, 2700) / 50) * 50,
      girdersPerSpan: GIRDERS_PER_SPAN,
      concreteStrengthMpa: whole(41, 55),
      // One bottom row per girder, sized to the span as the demo's first row is, at most 12 strands.
      strandCount: Math.min(12, Math.round(6 + lengthM * 0.2)),
      fpeMpa: whole(1080, 1160),
    };
  });
}

/** The records of one sheet for one structure, in file order. */
function recordsOf(sheet: BenchImportSheet, planned: PlannedStructure): SheetRecord[] {
  if (sheet === 'structures') return [planned.record];
  const spanIndices = Array.from({ length: SPANS_PER_STRUCTURE }, (_, offset) => offset + 1);
  if (sheet === 'spans') return spanIndices.map((spanIndex) => inventedSpanRow(planned, spanIndex));
  // One bottom strand row per girder.
  const perGirder = (spanIndex: number, girderNumber: number) =>
    sheet === 'girders' ? [inventedGirderRow(planned, spanIndex, girderNumber)] : inventedStrandRows(planned, spanIndex, girderNumber, [planned.strandCount]);
  return spanIndices.flatMap((spanIndex) => Array.from({ length: GIRDERS_PER_SPAN }, (_, offset) => perGirder(spanIndex, offset + 1)).flat());
}

/** One sheet as the XLSX templates lay it out (shared/src/imports/templates.ts): every column, text columns as text. */
async function writeSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, sheet: BenchImportSheet, structures: readonly PlannedStructure[]): Promise<number> {
  const columns = IMPORT_TEMPLATES[sheet].columns;
  const worksheet = workbook.addWorksheet(sheet);
  // The column formats must be set before the first row is committed: the streaming writer writes them first.
  columns.forEach((column, index) => {
    const sheetColumn = worksheet.getColumn(index + 1);
    sheetColumn.width = Math.max(12, column.header.length + 2);
    if (column.type !== 'number' && column.type !== 'whole-number') sheetColumn.numFmt = '@';
  });
  const header = worksheet.addRow(columns.map((column) => column.header));
  header.font = { bold: true };
  header.commit();
  const unknown = new Set<string>();
  let rowCount = 0;
  for (const planned of structures) {
    for (const record of recordsOf(sheet, planned)) {
      for (const key of Object.keys(record)) if (!columns.some((column) => column.header === key)) unknown.add(key);
      worksheet.addRow(columns.map((column) => record[column.header] ?? null)).commit();
      rowCount += 1;
    }
  }
  if (unknown.size > 0) throw new Error(`the ${sheet} sheet has no column ${[...unknown].join(', ')}`);
  worksheet.commit();
  return rowCount;
}

export interface BenchImportFile {
  readonly filePath: string;
  readonly byteSize: number;
  /** Data rows of each sheet, header rows not counted. */
  readonly rowsPerSheet: Readonly<Record<BenchImportSheet, number>>;
  readonly structureNumbers: readonly string[];
}

/**
 * Writes a workbook of `girderCount` girders (a whole number of structures of
 * GIRDERS_PER_STRUCTURE girders each) with exceljs's streaming writer, the way a large export
 * from another system would be written, with one strand row per girder.
 */
export async function writeBenchImportWorkbook(filePath: string, girderCount: number): Promise<BenchImportFile> {
  if (!Number.isInteger(girderCount) || girderCount <= 0 || girderCount % GIRDERS_PER_STRUCTURE !== 0) {
    throw new Error(`the girder count must be a whole multiple of ${GIRDERS_PER_STRUCTURE} (${SPANS_PER_STRUCTURE} spans of ${GIRDERS_PER_SPAN} girders a structure), not ${girderCount}`);
  }
  const structures = plannedStructures(girderCount / GIRDERS_PER_STRUCTURE);
  // Shared strings, as a spreadsheet program saves them; styles for the bold headers and text formats.
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: filePath, useStyles: true, useSharedStrings: true });
  const rowsPerSheet = {} as Record<BenchImportSheet, number>;
  for (const sheet of BENCH_IMPORT_SHEETS) rowsPerSheet[sheet] = await writeSheet(workbook, sheet, structures);
  await workbook.commit();
  return { filePath, byteSize: (await stat(filePath)).size, rowsPerSheet, structureNumbers: structures.map((planned) => planned.structureNumber) };
}
