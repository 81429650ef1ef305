import type { Girder, Span } from '../../../shared/src';

/** A girder as stored: its row, its type's section (when it has one) and its strand rows in order. */
export interface StoredGirder {
  readonly girder: {
    girder_number: number;
    position: 'interior' | 'exterior';
    section: Record<string, unknown> | null;
    section_overrides: Record<string, unknown>;
    concrete: Girder['concrete'];
    deck_concrete: Omit<NonNullable<Girder['deck']>, 'widthMm' | 'thicknessMm' | 'haunchMm'>;
    tensioning: 'pre' | 'post';
    losses: Record<string, unknown>;
    profiles: unknown[];
    debonding: unknown[];
    bars: Girder['bars'];
  };
  readonly typeSection: Record<string, unknown> | null;
  readonly strandRows: readonly {
    row_key: string;
    y_mm: number;
    strand_count: number;
    x_mm: number[] | null;
    strand_area_mm2: number;
    strand_diameter_mm: number;
    fpu_mpa: number;
    fpy_mpa: number;
    eps_mpa: number;
    fpe_mpa: number | null;
    bonded: boolean;
    unbonded_length_mm: number | null;
  }[];
}

export interface StoredSpan {
  length_m: number;
  girder_count: number;
  girder_spacing_mm: number;
  overhang_mm: number;
  roadway_width_mm: number;
  barrier_face_to_girder_mm: number | null;
  deck_thickness_mm: number;
  haunch_mm: number;
  wearing_surface: Span['wearingSurface'] | null;
  barriers: Readonly<Span['barriers']>;
  diaphragms: Readonly<Span['diaphragms']>;
}

/** Every field of `StoredSpan`: what `girderCalcFileParts` may read of a span row. */
export const STORED_SPAN_FIELDS = [
  'length_m',
  'girder_count',
  'girder_spacing_mm',
  'overhang_mm',
  'roadway_width_mm',
  'barrier_face_to_girder_mm',
  'deck_thickness_mm',
  'haunch_mm',
  'wearing_surface',
  'barriers',
  'diaphragms',
] as const satisfies readonly (keyof StoredSpan)[];

/** Fails to compile when `StoredSpan` gains a field the list above leaves out. */
const everyStoredSpanFieldListed: Record<Exclude<keyof StoredSpan, (typeof STORED_SPAN_FIELDS)[number]>, never> = {};
void everyStoredSpanFieldListed;

/**
 * The calculation file's `girder`, `span`, `profiles`, `debonding` and `losses` parts of one
 * stored girder (docs/calc-file.md): the stored columns map one-to-one onto the file's keys, so
 * a rating is assembled from the inventory without loss. The deck width is the span's girder
 * spacing; the rating policy decides the effective width.
 */
export function girderCalcFileParts(stored: StoredGirder, span: StoredSpan, skewDeg: number) {
  const { girder } = stored;
  const section = girder.section ?? { ...stored.typeSection, ...girder.section_overrides };
  return {
    girder: {
      section,
      concrete: girder.concrete,
      deck: { ...girder.deck_concrete, widthMm: span.girder_spacing_mm, thicknessMm: span.deck_thickness_mm, haunchMm: span.haunch_mm },
      strandRows: stored.strandRows.map((row) => ({
        id: row.row_key,
        yMm: row.y_mm,
        count: row.strand_count,
        ...(row.x_mm ? { xMm: row.x_mm } : {}),
        strandAreaMm2: row.strand_area_mm2,
        strandDiameterMm: row.strand_diameter_mm,
        fpuMpa: row.fpu_mpa,
        fpyMpa: row.fpy_mpa,
        epsMpa: row.eps_mpa,
        ...(row.fpe_mpa !== null ? { fpeMpa: row.fpe_mpa } : {}),
        bonded: row.bonded,
        ...(row.unbonded_length_mm !== null ? { unbondedLengthMm: row.unbonded_length_mm } : {}),
      })),
      bars: girder.bars,
      tensioning: girder.tensioning,
    },
    span: {
      lengthM: span.length_m,
      girderCount: span.girder_count,
      girderSpacingMm: span.girder_spacing_mm,
      girder: girder.girder_number,
      position: girder.position,
      overhangMm: span.overhang_mm,
      roadwayWidthMm: span.roadway_width_mm,
      skewDeg,
      ...(span.barrier_face_to_girder_mm !== null ? { barrierFaceToGirderMm: span.barrier_face_to_girder_mm } : {}),
      ...(span.wearing_surface ? { wearingSurface: span.wearing_surface } : {}),
      barriers: span.barriers,
      diaphragms: span.diaphragms,
    },
    profiles: girder.profiles,
    debonding: girder.debonding,
    losses: girder.losses,
  };
}
