import type { GirderRecord } from '../../../shared/src';
import type { StoredGirder } from './girder-calc-file';
import type { GirderColumns, GirderRow, StrandRowRecord } from './girders.repository';

/** The stored girder row and strand rows as the API's girder record (the calculation file's parts). */
export function toGirderRecord(row: GirderRow, strandRows: readonly StrandRowRecord[]): GirderRecord {
  return {
    position: row.position,
    girderTypeId: row.girder_type_id,
    sectionOverrides: row.section_overrides,
    customSection: row.section as GirderRecord['customSection'],
    concrete: row.concrete,
    deckConcrete: row.deck_concrete as GirderRecord['deckConcrete'],
    strandRows: strandRows.map((strandRow) => ({
      id: strandRow.row_key,
      yMm: strandRow.y_mm,
      count: strandRow.strand_count,
      ...(strandRow.x_mm ? { xMm: strandRow.x_mm } : {}),
      strandAreaMm2: strandRow.strand_area_mm2,
      strandDiameterMm: strandRow.strand_diameter_mm,
      fpuMpa: strandRow.fpu_mpa,
      fpyMpa: strandRow.fpy_mpa,
      epsMpa: strandRow.eps_mpa,
      ...(strandRow.fpe_mpa !== null ? { fpeMpa: strandRow.fpe_mpa } : {}),
      bonded: strandRow.bonded,
      ...(strandRow.unbonded_length_mm !== null ? { unbondedLengthMm: strandRow.unbonded_length_mm } : {}),
    })),
    bars: row.bars,
    tensioning: row.tensioning,
    profiles: row.profiles as GirderRecord['profiles'],
    debonding: row.debonding as GirderRecord['debonding'],
    losses: row.losses as GirderRecord['losses'],
  };
}

/** The girder record as the columns and strand rows it is stored in. */
export function girderColumnsOf(record: GirderRecord): { columns: GirderColumns; strandRows: StrandRowRecord[] } {
  return {
    columns: {
      position: record.position,
      girder_type_id: record.girderTypeId,
      section: record.customSection,
      section_overrides: record.girderTypeId === null ? {} : record.sectionOverrides,
      concrete: record.concrete,
      deck_concrete: record.deckConcrete as StoredGirder['girder']['deck_concrete'],
      tensioning: record.tensioning,
      losses: record.losses,
      profiles: record.profiles,
      debonding: record.debonding,
      bars: record.bars,
    },
    strandRows: record.strandRows.map((row) => ({
      row_key: row.id,
      y_mm: row.yMm,
      strand_count: row.count,
      x_mm: row.xMm ?? null,
      strand_area_mm2: row.strandAreaMm2,
      strand_diameter_mm: row.strandDiameterMm,
      fpu_mpa: row.fpuMpa,
      fpy_mpa: row.fpyMpa,
      eps_mpa: row.epsMpa,
      fpe_mpa: row.fpeMpa ?? null,
      bonded: row.bonded,
      unbonded_length_mm: row.unbondedLengthMm ?? null,
    })),
  };
}

/**
 * Where a problem the engine finds in the assembled calculation file lies in the girder record:
 * `girder.strandRows[2].yMm` is `strandRows.2.yMm`, `girder.deck.strengthMpa` is
 * `deckConcrete.strengthMpa`, a section dimension is the override or the custom section's.
 */
export function recordPathOf(calcFilePath: string, record: GirderRecord): string {
  const dotted = calcFilePath.replace(/\[(\d+)\]/g, '.$1');
  const section = /^girder\.section(\.|$)(.*)$/.exec(dotted);
  if (section) {
    const key = section[2] ?? '';
    if (record.girderTypeId === null) return key ? `customSection.${key}` : 'customSection';
    const topKey = key.split('.')[0] ?? '';
    return topKey in record.sectionOverrides ? `sectionOverrides.${topKey}` : 'girderTypeId';
  }
  // The girder's place across the span is the record's; the rest of `span` is the span's own data.
  if (dotted === 'span.position') return 'position';
  if (dotted.startsWith('girder.deck.')) return dotted.replace('girder.deck.', 'deckConcrete.');
  return dotted.replace(/^girder\./, '');
}
