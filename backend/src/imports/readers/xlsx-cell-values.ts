import { ImportFileError } from './import-file-error';
import { columnLetter } from './sheet-table';

/** Serial day 25569 is 1970-01-01 in the 1900 date system; the 1904 system starts 1462 days later (ECMA-376 Part 1, 18.17.4.1). */
const UNIX_EPOCH_SERIAL = 25569;
const DATE_1904_OFFSET_DAYS = 1462;
const MS_PER_DAY = 24 * 60 * 60 * 1000;

/**
 * The built-in number formats that show a date or a time (ECMA-376 Part 1, 18.8.30): 14–22 in every
 * locale, 27–36 and 50–58 the East Asian date formats, 45–47 minutes and seconds.
 */
const BUILT_IN_DATE_FORMAT_IDS: ReadonlySet<number> = new Set([
  ...range(14, 22),
  ...range(27, 36),
  ...range(45, 47),
  ...range(50, 58),
]);

function range(first: number, last: number): number[] {
  return Array.from({ length: last - first + 1 }, (_, index) => first + index);
}

/**
 * Whether number format `numberFormatId` shows a date or time; `customFormats` are the workbook's own
 * (`<numFmts>`), which take precedence over the built-in meaning of an id.
 */
export function isDateFormatId(numberFormatId: number, customFormats: ReadonlyMap<number, string>): boolean {
  const custom = customFormats.get(numberFormatId);
  if (custom !== undefined) return isDateFormat(custom);
  return BUILT_IN_DATE_FORMAT_IDS.has(numberFormatId);
}

/** A number format shows a date or time when, outside quotes and brackets, it uses a date or time code. */
export function isDateFormat(format: string | undefined): boolean {
  if (!format) return false;
  const codes = format.replace(/\[[^\]]*]/g, '').replace(/"[^"]*"/g, '');
  return /[ymdhs]/i.test(codes);
}

export function serialToDate(serial: number, date1904: boolean): Date {
  const days = serial - UNIX_EPOCH_SERIAL + (date1904 ? DATE_1904_OFFSET_DAYS : 0);
  return new Date(Math.round(days * MS_PER_DAY));
}

const ISO_DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?)?(Z|([+-])(\d{2}):?(\d{2}))?$/;
const MS_PER_MINUTE = 60 * 1000;

/**
 * A `t="d"` cell's ISO 8601 text (ECMA-376 Part 1, 18.17.4.1) as a Date; undefined when it is not one.
 * Without a zone it is read as UTC, as serial dates are, so the same day comes out either way.
 */
export function isoTextToDate(text: string): Date | undefined {
  const match = ISO_DATE_TIME.exec(text.trim());
  if (!match) return undefined;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  const hours = Number(match[4] ?? 0);
  const minutes = Number(match[5] ?? 0);
  const seconds = Number(match[6] ?? 0);
  const fraction = match[7] === undefined ? 0 : Math.round(Number(match[7]) * 1000);
  const date = new Date(0);
  date.setUTCFullYear(year, month - 1, day);
  date.setUTCHours(hours, minutes, seconds, fraction);
  // Date rolls 2025-02-30 over into March; a day that does not exist is not a date.
  if (date.getUTCMonth() !== month - 1 || date.getUTCDate() !== day || hours > 23 || minutes > 59 || seconds > 59) return undefined;
  if (match[9] !== undefined) {
    const offsetMinutes = Number(match[10]) * 60 + Number(match[11]);
    date.setTime(date.getTime() - (match[9] === '-' ? -1 : 1) * offsetMinutes * MS_PER_MINUTE);
  }
  return date;
}

/** Where a cell is, as the person importing sees it. */
export interface CellPosition {
  readonly sheet: string;
  readonly row: number;
  readonly column: string;
}

export function cellPosition(sheet: string, row: number, column: number): CellPosition {
  return { sheet, row, column: columnLetter(column) };
}

/** `shown` is the error text (`#DIV/0!`) when the file names it. */
export function cellError(at: CellPosition, shown?: string): ImportFileError {
  return new ImportFileError({
    code: 'cell_error',
    message: `Sheet "${at.sheet}", row ${at.row}, column ${at.column} shows an error${shown ? ` (${shown})` : ''}; correct it or clear the cell`,
    ...at,
  });
}

/** The value the spreadsheet program stored when it last calculated is what is read; a formula without one is refused, never evaluated. */
export function formulaWithoutValue(at: CellPosition): ImportFileError {
  return new ImportFileError({
    code: 'formula_without_value',
    message: `Sheet "${at.sheet}", row ${at.row}, column ${at.column}: formula without a stored value: open and save the file in a spreadsheet program, or paste values`,
    ...at,
  });
}

export function unreadable(at: CellPosition): ImportFileError {
  return new ImportFileError({
    code: 'corrupt_file',
    message: `Sheet "${at.sheet}", row ${at.row}, column ${at.column} holds a value this reader does not understand`,
    ...at,
  });
}
