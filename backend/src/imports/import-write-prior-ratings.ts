import type { ConvertedRow, SignedInUser } from '../../../shared/src';
import type { Transaction } from '../db/database';
import { AppError, type InvalidField } from '../http/app-error';
import { recordPriorRating } from '../prior-ratings/prior-ratings.service';
import { findSpansOfStructure } from '../spans/spans.repository';
import { findStructuresByNumbers } from '../structures/structures.repository';

/** The prior-ratings template's columns by the body's fields, for naming a refusal at its cell. */
const COLUMN_OF: Readonly<Record<string, string>> = {
  structureNumber: 'structure_number',
  spanIndex: 'span_index',
  lowestLegalRatingFactor: 'lowest_legal_rf',
  designInventoryRatingFactor: 'design_inventory_rf',
  approvedOn: 'approved_on',
  sourceNote: 'source_note',
};

/** The file's column a field of a prior rating stands for; the row's key for anything else. */
export function priorRatingColumnOf(row: ConvertedRow<'prior-ratings'>, field: string): string {
  return COLUMN_OF[field] ?? row.keyColumns;
}

/**
 * Writes a prior-ratings row through the prior-ratings rules (`recordPriorRating`) on the
 * structure and span named — in the register, or written earlier by this file — refused at the
 * file's own columns.
 */
export async function writePriorRatingRow(trx: Transaction, user: SignedInUser, row: ConvertedRow<'prior-ratings'>): Promise<void> {
  const { structureNumber, spanIndex, ...rating } = row.body;
  const [structure] = await findStructuresByNumbers(trx, [structureNumber]);
  if (!structure) throw AppError.invalidFields([{ field: 'structure_number', message: `structure ${structureNumber} is not in the register` }]);
  const span = spanIndex === null ? null : (await findSpansOfStructure(trx, structure.id)).find((each) => each.span_index === spanIndex);
  if (span === undefined) throw AppError.invalidFields([{ field: 'span_index', message: `structure ${structureNumber} has no span ${spanIndex}` }]);
  try {
    await recordPriorRating({ db: trx, user }, { structureId: structure.id, spanId: span?.id ?? null, rating });
  } catch (error) {
    const fields = error instanceof AppError ? (error.details as { fields?: InvalidField[] } | null)?.fields : undefined;
    if (!fields || fields.length === 0) throw error;
    throw AppError.invalidFields(fields.map((field) => ({ field: priorRatingColumnOf(row, field.field), message: field.message })));
  }
}
