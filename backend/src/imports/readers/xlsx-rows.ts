import { createReadStream } from 'node:fs';
import ExcelJS from 'exceljs';
import { ImportFileError } from './import-file-error';
import { columnLetter, type CellValue, type RawRow } from './sheet-table';

/** Serial day 25569 is 1970-01-01 in the 1900 date system; the 1904 system starts 1462 days later (ECMA-376 Part 1, 18.17.4.1). */
const UNIX_EPOCH_SERIAL = 25569;
const DATE_1904_OFFSET_DAYS = 1462;
const MS_PER_DAY = 24 * 60 * 60 * 1000;

interface CellPosition {
  readonly sheet: string;
  readonly row: number;
  readonly column: string;
}

/**
 * Streams every worksheet's rows with exceljs's streaming reader. Styles are cached so that cells with
 * a date format come back as dates; formulas give their stored result and are never evaluated.
 * Call only after `checkXlsxSafety` has passed the file.
 */
export async function* readXlsxRows(filePath: string): AsyncGenerator<RawRow> {
  const source = createReadStream(filePath);
  const workbook = new ExcelJS.stream.xlsx.WorkbookReader(source, {
    worksheets: 'emit',
    sharedStrings: 'cache',
    styles: 'cache',
    hyperlinks: 'ignore',
    entries: 'ignore',
  });
  const usesDate1904 = () => Boolean((workbook as { properties?: { model?: { date1904?: boolean } } }).properties?.model?.date1904);
  try {
    for await (const worksheet of workbook) {
      const sheet = (worksheet as { name?: string }).name ?? 'Sheet';
      for await (const row of worksheet) {
        const cells: Array<{ column: number; value: CellValue }> = [];
        row.eachCell({ includeEmpty: false }, (cell, column) => {
          const position = { sheet, row: row.number, column: columnLetter(column) };
          cells.push({ column, value: plainValue(cell.value, cell.numFmt, usesDate1904(), position) });
        });
        yield { sheet, rowNumber: row.number, cells };
      }
    }
    checkWorkbookPartWasRead(workbook);
  } finally {
    source.destroy();
  }
}

/**
 * exceljs 4.4's streaming reader can lose every part after an uncompressed worksheet stored before
 * xl/workbook.xml: rows then arrive without sheet names or date styles. Refuse instead of misreading.
 */
function checkWorkbookPartWasRead(workbook: object): void {
  if ((workbook as { model?: unknown }).model) return;
  throw new ImportFileError({
    code: 'corrupt_file',
    message: 'The workbook could not be read completely; open and save it in a spreadsheet program, then upload it again',
  });
}

/** exceljs's cell value as one of the plain values an import row holds. */
function plainValue(value: unknown, numberFormat: string | undefined, date1904: boolean, at: CellPosition): CellValue {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string' || typeof value === 'boolean' || value instanceof Date) return value;
  if (typeof value === 'number') return Number.isFinite(value) ? value : cellError(at);
  if (typeof value !== 'object') return unreadable(at);
  const object = value as Record<string, unknown>;
  // Shared formulas after the first cell carry an empty `formula`, so look for the key, not its text.
  if ('formula' in object || 'sharedFormula' in object) return formulaResult(object.result, numberFormat, date1904, at);
  if (Array.isArray(object.richText)) return object.richText.map((run: { text?: string }) => run.text ?? '').join('');
  if ('error' in object) return cellError(at, String(object.error));
  if ('hyperlink' in object && 'text' in object) return plainValue(object.text, numberFormat, date1904, at);
  return unreadable(at);
}

/** The value the spreadsheet program stored when it last calculated; a formula without one is refused, never evaluated. */
function formulaResult(result: unknown, numberFormat: string | undefined, date1904: boolean, at: CellPosition): CellValue {
  if (result === undefined || result === null) {
    throw new ImportFileError({
      code: 'formula_without_value',
      message: `Sheet "${at.sheet}", row ${at.row}, column ${at.column}: formula without a stored value: open and save the file in a spreadsheet program, or paste values`,
      ...at,
    });
  }
  if (typeof result === 'object' && !(result instanceof Date)) {
    if ('error' in result) return cellError(at, String((result as { error: unknown }).error));
    return unreadable(at);
  }
  // The streaming reader stores a numeric result as a plain number, even in a date-formatted cell.
  if (typeof result === 'number' && Number.isFinite(result) && isDateFormat(numberFormat)) {
    return serialToDate(result, date1904);
  }
  return plainValue(result, numberFormat, date1904, at);
}

/** A number format shows a date or time when, outside quotes and brackets, it uses a date or time code. */
function isDateFormat(format: string | undefined): boolean {
  if (!format) return false;
  const codes = format.replace(/\[[^\]]*]/g, '').replace(/"[^"]*"/g, '');
  return /[ymdhs]/i.test(codes);
}

function serialToDate(serial: number, date1904: boolean): Date {
  const days = serial - UNIX_EPOCH_SERIAL + (date1904 ? DATE_1904_OFFSET_DAYS : 0);
  return new Date(Math.round(days * MS_PER_DAY));
}

/** `shown` is the error text (`#DIV/0!`) when the file names it; a formula's error result arrives as NaN. */
function cellError(at: CellPosition, shown?: string): never {
  throw new ImportFileError({
    code: 'cell_error',
    message: `Sheet "${at.sheet}", row ${at.row}, column ${at.column} shows an error${shown ? ` (${shown})` : ''}; correct it or clear the cell`,
    ...at,
  });
}

function unreadable(at: CellPosition): never {
  throw new ImportFileError({
    code: 'corrupt_file',
    message: `Sheet "${at.sheet}", row ${at.row}, column ${at.column} holds a value this reader does not understand`,
    ...at,
  });
}
