import { seededRandom } from '../../seeds/demo-structures';
import { inventedGirderRow, inventedSpanRow, inventedStrandRows, type InventedSpans } from '../../scripts/lib/invented-inventory-rows';
import { IMPORT_TEMPLATES, type ImportTemplateName } from '../../shared/src';
import { sampleWorkbook, type SampleCell, type SampleSheet } from '../../scripts/write-import-samples';

/**
 * The workbook of the imports journey: an invented extension of the demo authority's East
 * District (seeds/demo-structures.ts) in the import templates' four inventory sheets, laid out
 * as the XLSX templates are (scripts/write-import-samples.ts formats it). The values follow the
 * rules the demo's inventory is built by; a fixed seed gives the same file on every run. Then the
 * same workbook as a person might first fill it in, with a few mistakes, and the problems the
 * check must name for them.
 */

export const INVENTORY_SHEETS = ['structures', 'spans', 'girders', 'strand-rows'] as const satisfies readonly ImportTemplateName[];
type InventorySheet = (typeof INVENTORY_SHEETS)[number];

/** A row by the template's SI headers; headers left out are empty cells. */
type SheetRecord = Readonly<Record<string, SampleCell>>;
export type JourneyRecords = Readonly<Record<InventorySheet, readonly SheetRecord[]>>;

export const STRUCTURE_COUNT = 12;
export const SPANS_PER_STRUCTURE = 3;
export const GIRDERS_PER_SPAN = 8;

/**
 * The demo's East District (seeds/demo-structures.ts), whose rater may add structures there. The
 * demo numbers its structures 0101–0178; these take 0801 on, so that "BV-E-08" finds them alone.
 */
const EAST_DISTRICT = {
  name: 'East District',
  /** West, south, east, north in degrees: the demo's own area for the district, inside the basemap's Kansas outline. */
  area: [-97.4, 37.6, -96.6, 39.4] as const,
  routes: ['Route 15', 'Route 77', 'County Road 412', 'County Road 455'],
  towns: ['Quarry Hill', 'Lanning', 'Ostrow'],
};
export const STRUCTURE_NUMBER_PREFIX = 'BV-E-08';
const CROSSINGS = [
  'Walnut Bend Creek', 'Sumac Draw', 'Cedar Lick Branch', 'Prairie Dog Run', 'Coyote Hollow', 'Limestone Ford',
  'Bittercress Slough', 'Tallgrass Spur Railway', 'Elm Shoal Creek', 'Goldenrod Branch', 'Flax Meadow Drain', 'Maple Ridge Creek',
];
const NOTE = 'Invented for the imports browser journey (tests/browser/imports.test.ts).';

interface PlannedStructure extends InventedSpans {
  readonly record: SheetRecord;
  /** Strands of the bottom row and of the row above it, by the demo's rule for the span's length. */
  readonly strandCounts: readonly [number, number];
  readonly fpeMpa: number;
}

function plannedStructures(): PlannedStructure[] {
  const random = seededRandom(20270415);
  const between = (low: number, high: number) => low + (high - low) * random();
  const whole = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));
  const [west, south, east, north] = EAST_DISTRICT.area;
  return CROSSINGS.slice(0, STRUCTURE_COUNT).map((crossing, index) => {
    const structureNumber = `${STRUCTURE_NUMBER_PREFIX}${String(index + 1).padStart(2, '0')}`;
    const adt = Math.round(between(400, 18000) / 10) * 10;
    // Spans of 26 m or less, where the demo harps no strands: the import has no column for a harped profile.
    const lengthM = Math.round(between(16, 26) * 2) / 2;
    // seeds/demo-inventory.ts: bottom strands 8 + 0.55 per metre of span (+ up to 4), 12 to a row, at least 4 in the second.
    const bottomStrands = Math.min(24, Math.round(8 + lengthM * 0.55 + random() * 4));
    return {
      structureNumber,
      girdersPerSpan: GIRDERS_PER_SPAN,
      record: {
        structure_number: structureNumber,
        name: `${crossing} Bridge near ${EAST_DISTRICT.towns[index % EAST_DISTRICT.towns.length]}`,
        route_carried: EAST_DISTRICT.routes[index % EAST_DISTRICT.routes.length]!,
        feature_crossed: crossing,
        district: EAST_DISTRICT.name,
        // Kept a tenth of a degree inside the district's area, well inside the state outline.
        longitude_deg: Number(between(west + 0.1, east - 0.1).toFixed(5)),
        latitude_deg: Number(between(south + 0.1, north - 0.1).toFixed(5)),
        year_built: whole(1962, 2018),
        adt,
        adtt: Math.round(adt * between(0.04, 0.22)),
        skew_deg: random() < 0.6 ? 0 : whole(1, 6) * 5,
        deck_condition: whole(5, 8),
        superstructure_condition: whole(5, 8),
        substructure_condition: whole(5, 8),
        condition_rated_on: `2026-${String(whole(3, 10)).padStart(2, '0')}-${String(whole(1, 28)).padStart(2, '0')}`,
        status: 'open',
        notes: NOTE,
      },
      lengthM,
      spacingMm: Math.round(between(2100, 2700) / 50) * 50,
      concreteStrengthMpa: whole(41, 55),
      strandCounts: [12, Math.max(4, bottomStrands - 12)],
      fpeMpa: whole(1080, 1160),
    };
  });
}

const spanIndices = () => Array.from({ length: SPANS_PER_STRUCTURE }, (_, offset) => offset + 1);
const girderNumbers = () => Array.from({ length: GIRDERS_PER_SPAN }, (_, offset) => offset + 1);

/** The clean workbook's rows, sheet by sheet, in file order. */
export function journeyRecords(): JourneyRecords {
  const structures = plannedStructures();
  const eachGirder = structures.flatMap((planned) => spanIndices().flatMap((spanIndex) => girderNumbers().map((girderNumber) => ({ planned, spanIndex, girderNumber }))));
  return {
    structures: structures.map((planned) => planned.record),
    spans: structures.flatMap((planned) => spanIndices().map((spanIndex) => inventedSpanRow(planned, spanIndex))),
    girders: eachGirder.map(({ planned, spanIndex, girderNumber }) => inventedGirderRow(planned, spanIndex, girderNumber)),
    'strand-rows': eachGirder.flatMap(({ planned, spanIndex, girderNumber }) => inventedStrandRows(planned, spanIndex, girderNumber, planned.strandCounts)),
  };
}

/** A problem as the Imports page lists it: where it is, and the value the file held. */
export interface ExpectedProblem {
  readonly sheet: InventorySheet;
  readonly row: number;
  readonly column: string;
  readonly value: string;
}

/** "Type 3" typed for the catalogue's "Type III". */
const ARABIC_NUMERALS = { II: '2', III: '3', IV: '4' } as const;

/** The sheet's row number of a record: row 1 holds the headers. */
const rowNumberOf = (index: number) => index + 2;

/**
 * The workbook as first filled in: a latitude with a digit too many, a girder typed in for a span
 * the file does not have, a girder type misspelt, and a strand height typed with its unit. The
 * structure whose latitude is refused is missing from the file's structures as the check reads
 * it, so each of its spans is named too.
 */
export function recordsWithMistakes(clean: JourneyRecords): { records: JourneyRecords; problems: ExpectedProblem[] } {
  const structures = [...clean.structures];
  const girders = [...clean.girders];
  const strandRows = [...clean['strand-rows']];

  const badLatitude = 2;
  const latitude = Number(structures[badLatitude]!['latitude_deg']);
  const latitudeTyped = Number(`1${latitude}`);
  structures[badLatitude] = { ...structures[badLatitude], latitude_deg: latitudeTyped };
  const refusedNumber = String(structures[badLatitude]!['structure_number']);
  const orphanedSpans = clean.spans.flatMap((span, index) => (span['structure_number'] === refusedNumber ? [index] : []));

  const badType = 40;
  const typeName = String(girders[badType]!['girder_type']);
  const typeTyped = typeName.replace(/Type (II|III|IV) /, (_, numeral: keyof typeof ARABIC_NUMERALS) => `Type ${ARABIC_NUMERALS[numeral]} `);
  girders[badType] = { ...girders[badType], girder_type: typeTyped };

  const strayOf = clean.structures[4]!['structure_number']!;
  const straySpan = SPANS_PER_STRUCTURE + 1;
  girders.push({ ...clean.girders.find((girder) => girder['structure_number'] === strayOf)!, span_index: straySpan, girder_number: 1 });

  const badHeight = 301;
  const heightTyped = `${strandRows[badHeight]!['y_mm']} mm`;
  strandRows[badHeight] = { ...strandRows[badHeight], y_mm: heightTyped };

  return {
    records: { structures, spans: clean.spans, girders, 'strand-rows': strandRows },
    problems: [
      { sheet: 'structures', row: rowNumberOf(badLatitude), column: 'latitude_deg', value: String(latitudeTyped) },
      ...orphanedSpans.map((index) => ({ sheet: 'spans' as const, row: rowNumberOf(index), column: 'structure_number, span_index', value: refusedNumber })),
      { sheet: 'girders', row: rowNumberOf(badType), column: 'girder_type', value: typeTyped },
      { sheet: 'girders', row: rowNumberOf(girders.length - 1), column: 'structure_number, span_index, girder_number', value: `${strayOf} span ${straySpan}` },
      { sheet: 'strand-rows', row: rowNumberOf(badHeight), column: 'y_mm', value: heightTyped },
    ],
  };
}

/** Lays records out in the template's column order, refusing a header the template does not have. */
function sheetOf(template: InventorySheet, records: readonly SheetRecord[]): SampleSheet {
  const headers = IMPORT_TEMPLATES[template].columns.map((column) => column.header);
  for (const record of records) {
    const unknown = Object.keys(record).filter((header) => !headers.includes(header));
    if (unknown.length > 0) throw new Error(`${template} sheet: no such column ${unknown.join(', ')}`);
  }
  return { template, headers, rows: records.map((record) => headers.map((header) => record[header] ?? null)) };
}

/** The XLSX file of the records, one sheet per template named after it. */
export async function workbookBytes(records: JourneyRecords): Promise<Buffer> {
  const workbook = sampleWorkbook(INVENTORY_SHEETS.map((template) => sheetOf(template, records[template])));
  return Buffer.from(await workbook.xlsx.writeBuffer());
}
