/**
 * Rows of the inventory import templates (shared/src/imports/columns.ts) for invented spans built
 * the way the demo builds its network (seeds/demo-inventory.ts): the benchmark's large workbook and
 * the browser journey's small one both write their spans, girders and strand rows with these.
 */
import girderTypeCatalogue from '../../seeds/data/girder-types.json';

/** A row by the template's SI headers; headers left out are empty cells. */
export type InventedRow = Readonly<Record<string, string | number | null>>;

/** The demo's strand (seeds/demo-inventory.ts): 12.7 mm seven-wire strand, fpu 1860 MPa. */
const DEMO_STRAND = { strand_area_mm2: 98.7, strand_diameter_mm: 12.7, fpu_mpa: 1860, fpy_mpa: 1674, eps_mpa: 196500 };
/** The demo's deck edge (seeds/demo-inventory.ts); common practice, no source. */
const OVERHANG_MM = 900;
const BARRIER_FACE_TO_GIRDER_MM = 450;

/** The catalogue type the demo builds a span of this length with (seeds/demo-inventory.ts), checked against the catalogue it loads. */
export function girderTypeFor(lengthM: number): string {
  const name = lengthM < 18 ? 'AASHTO Type II I-girder' : lengthM < 24 ? 'AASHTO Type III I-girder' : 'AASHTO Type IV I-girder';
  if (!girderTypeCatalogue.types.some((type) => type.name === name)) throw new Error(`${name} is not in seeds/data/girder-types.json`);
  return name;
}

/** What every span of an invented structure shares: the demo gives all spans of a structure the same girders. */
export interface InventedSpans {
  readonly structureNumber: string;
  readonly lengthM: number;
  readonly spacingMm: number;
  readonly girdersPerSpan: number;
  readonly concreteStrengthMpa: number;
  readonly fpeMpa: number;
}

export function inventedSpanRow(spans: InventedSpans, spanIndex: number): InventedRow {
  return {
    structure_number: spans.structureNumber,
    span_index: spanIndex,
    span_length_m: spans.lengthM,
    girder_spacing_mm: spans.spacingMm,
    overhang_mm: OVERHANG_MM,
    roadway_width_mm: (spans.girdersPerSpan - 1) * spans.spacingMm + 2 * OVERHANG_MM - 2 * BARRIER_FACE_TO_GIRDER_MM,
    barrier_face_to_girder_mm: BARRIER_FACE_TO_GIRDER_MM,
    deck_thickness_mm: 200,
    haunch_mm: 25,
    wearing_surface_thickness_mm: 60,
    wearing_surface_unit_weight_kn_m3: 23,
    wearing_surface_measured: 'no',
    wearing_surface_kind: 'overlay',
    barrier_loads_kn_m: '7.5;7.5',
  };
}

export function inventedGirderRow(spans: InventedSpans, spanIndex: number, girderNumber: number): InventedRow {
  return {
    structure_number: spans.structureNumber,
    span_index: spanIndex,
    girder_number: girderNumber,
    position: girderNumber === 1 || girderNumber === spans.girdersPerSpan ? 'exterior' : 'interior',
    girder_type: girderTypeFor(spans.lengthM),
    concrete_strength_mpa: spans.concreteStrengthMpa,
    concrete_basis: 'cylinder',
    concrete_unit_weight_kn_m3: 24,
    deck_concrete_strength_mpa: 30,
    deck_concrete_basis: 'cylinder',
    tensioning: 'pre',
  };
}

/** Bottom strand rows at the demo's 50 mm pitch (seeds/demo-inventory.ts), `r1` lowest, with these strand counts. */
export function inventedStrandRows(spans: InventedSpans, spanIndex: number, girderNumber: number, strandCounts: readonly number[]): InventedRow[] {
  return strandCounts.map((count, index) => ({
    structure_number: spans.structureNumber,
    span_index: spanIndex,
    girder_number: girderNumber,
    row_id: `r${index + 1}`,
    y_mm: 50 + 50 * index,
    strand_count: count,
    ...DEMO_STRAND,
    fpe_mpa: spans.fpeMpa,
    bonded: 'yes',
  }));
}
