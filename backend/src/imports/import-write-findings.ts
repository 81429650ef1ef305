import { IMPORT_TEMPLATES, type ConvertedRow, type ImportColumn, type SignedInUser } from '../../../shared/src';
import type { Transaction } from '../db/database';
import { findGirdersOfSpans } from '../girders/girders.repository';
import { AppError, type InvalidField } from '../http/app-error';
import { recordImportedFinding } from '../inspections/inspections.service';
import { findSpansOfStructure } from '../spans/spans.repository';
import { findStructuresByNumbers } from '../structures/structures.repository';

const FINDING_COLUMNS = IMPORT_TEMPLATES.findings.columns;

const startsWith = (path: readonly string[], prefix: readonly string[]) => prefix.every((key, index) => path[index] === key);

/** The findings column at a place of the row's body: the one there, else the nearest above it (a list item is its list's), else the first inside it (`spall`). */
function columnAtPath(path: readonly string[]): ImportColumn | undefined {
  const exact = FINDING_COLUMNS.find((column) => column.path.length === path.length && startsWith(path, column.path));
  const above = FINDING_COLUMNS.filter((column) => startsWith(path, column.path)).sort((a, b) => b.path.length - a.path.length)[0];
  return exact ?? above ?? FINDING_COLUMNS.find((column) => startsWith(column.path, path));
}

/**
 * The file's column a field of the inspections API stands for in a findings row (`strands.rowId`
 * → `strand_row_id`, `toM` → `to_m`, `inspectedOn` → `inspected_on`), spelt as the file spells it
 * where the row knows (its key columns, which may be US customary), with its place in the row's
 * body; else the row's key.
 */
export function findingColumnOf(row: ConvertedRow<'findings'>, field: string): { readonly header: string; readonly path: readonly string[] | null } {
  const column = columnAtPath(field === 'inspectedOn' ? ['inspectedOn'] : ['finding', ...field.split('.')]);
  if (!column) return { header: row.keyColumns, path: null };
  const spelt = row.keyColumns.split(', ').find((header) => header.toLowerCase() === column.header || header.toLowerCase() === column.us?.header);
  return { header: spelt ?? column.header, path: column.path };
}

/** A refusal of the inspections rules, with each field named as the file's column. */
function atFileColumns(row: ConvertedRow<'findings'>, error: AppError): AppError {
  const fields = (error.details as { fields?: InvalidField[] } | null)?.fields;
  if (!fields || fields.length === 0) return error;
  return AppError.invalidFields(fields.map((field) => ({ field: findingColumnOf(row, field.field).header, message: field.message })));
}

async function girderIdOf(trx: Transaction, row: ConvertedRow<'findings'>): Promise<number> {
  const { structureNumber, spanIndex, girderNumber } = row.body;
  const [structure] = await findStructuresByNumbers(trx, [structureNumber]);
  const span = structure && (await findSpansOfStructure(trx, structure.id)).find((each) => each.span_index === spanIndex);
  const girder = span && (await findGirdersOfSpans(trx, [span.id])).find((each) => each.girder_number === girderNumber);
  if (!girder) throw AppError.invalidFields([{ field: row.keyColumns, message: 'this girder is neither in the register nor in this file' }]);
  return girder.id;
}

/**
 * Writes a findings row through the inspections rules (`recordImportedFinding`): the finding goes
 * into its structure's inspection of `inspected_on` — the one this import makes of that day, or
 * the importer's own draft — is checked against its girder as it stands once the file's girders
 * and strand rows are written, and refused at the file's own columns.
 */
export async function writeFindingRow(trx: Transaction, user: SignedInUser, row: ConvertedRow<'findings'>): Promise<void> {
  const girderId = await girderIdOf(trx, row);
  try {
    await recordImportedFinding({ db: trx, user }, girderId, row.body.inspectedOn, row.body.finding);
  } catch (error) {
    throw error instanceof AppError ? atFileColumns(row, error) : error;
  }
}
