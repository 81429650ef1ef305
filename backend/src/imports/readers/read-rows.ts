import path from 'node:path';
import { readCsvRows, type CsvDelimiter } from './csv-rows';
import { detectFileKind } from './file-kind';
import { ImportFileError } from './import-file-error';
import { nameCells, type ImportRow, type RawRow } from './sheet-table';
import { checkXlsxSafety, type XlsxSafetyLimits } from './xlsx-safety';
import { readXlsxRows } from './xlsx-rows';

export type { CellValue, ImportRow } from './sheet-table';

/**
 * Over twice what the import is benchmarked with: 50 000 girders come with their structures,
 * spans and strand rows, about 106 000 rows in all.
 */
export const DEFAULT_MAX_ROWS = 250_000;

export interface ReadRowsOptions {
  /** Data rows (header rows and empty rows not counted) over all sheets; more is refused. */
  readonly maxRows?: number;
  /** CSV only: the sheet name rows carry; defaults to the file's base name without its extension. */
  readonly sheetName?: string;
  /** CSV only: `auto` picks `;` when the header line has more semicolons than commas. */
  readonly csvDelimiter?: CsvDelimiter | 'auto';
  readonly xlsxLimits?: Partial<XlsxSafetyLimits>;
}

/**
 * Every data row of a CSV or XLSX file, read as a stream. The kind comes from the content, not the
 * name; an XLSX passes the zip safety checks before it is opened. Throws `ImportFileError` for a file
 * that cannot be imported as a whole; cell-level checks are the validator's.
 */
export async function* readRows(filePath: string, options: ReadRowsOptions = {}): AsyncGenerator<ImportRow> {
  const maxRows = options.maxRows ?? DEFAULT_MAX_ROWS;
  const rawRows = await openRawRows(filePath, options);
  let count = 0;
  for await (const row of nameCells(rawRows)) {
    count += 1;
    if (count > maxRows) {
      throw new ImportFileError({
        code: 'too_many_rows',
        message: `The file holds more than ${maxRows} rows (sheet "${row.sheet}" reached the limit at row ${row.rowNumber}); split it into smaller files`,
        sheet: row.sheet,
        row: row.rowNumber,
      });
    }
    yield row;
  }
}

async function openRawRows(filePath: string, options: ReadRowsOptions): Promise<AsyncIterable<RawRow>> {
  const kind = await detectFileKind(filePath);
  if (kind === 'xlsx') {
    await checkXlsxSafety(filePath, options.xlsxLimits);
    return readXlsxRows(filePath);
  }
  const sheet = options.sheetName ?? path.basename(filePath, path.extname(filePath));
  return readCsvRows(filePath, sheet, options.csvDelimiter ?? 'auto');
}
