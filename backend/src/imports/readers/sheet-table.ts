import { ImportFileError } from './import-file-error';

export type CellValue = string | number | boolean | Date | null;

/** One data row of a sheet, keyed by the header row's trimmed texts; every header is present (null when empty). */
export interface ImportRow {
  readonly sheet: string;
  /** The row number the spreadsheet program shows (CSV: the record's position, header = 1). */
  readonly rowNumber: number;
  readonly cells: Record<string, CellValue>;
}

/** A row as a file reader sees it, before the header gives its cells names. Columns count from 1. */
export interface RawRow {
  readonly sheet: string;
  readonly rowNumber: number;
  readonly cells: ReadonlyArray<{ readonly column: number; readonly value: CellValue }>;
}

/** A sheet's header row, read once and used for every data row of the sheet. */
interface Header {
  /** Header texts by column number; a column without a name is a hole. */
  readonly names: readonly (string | undefined)[];
  /** Every header with no value, in column order: each data row starts as a copy of it. */
  readonly emptyRow: Readonly<Record<string, CellValue>>;
}

/**
 * Turns raw rows (sheet after sheet) into named rows: in each sheet the first non-empty row is the
 * header, empty rows are skipped, and a value in a column without a header is refused rather than dropped.
 */
export async function* nameCells(rawRows: AsyncIterable<RawRow>): AsyncGenerator<ImportRow> {
  let currentSheet: string | undefined;
  let header: Header | undefined;
  let sawHeader = false;
  for await (const raw of rawRows) {
    if (raw.sheet !== currentSheet) {
      currentSheet = raw.sheet;
      header = undefined;
    }
    if (header === undefined) {
      const cells = filledCells(raw.cells);
      if (cells.length === 0) continue;
      header = readHeader(raw.sheet, raw.rowNumber, cells);
      sawHeader = true;
      continue;
    }
    const cells = namedCells(raw, header);
    if (cells !== undefined) yield { sheet: raw.sheet, rowNumber: raw.rowNumber, cells };
  }
  if (!sawHeader) {
    throw new ImportFileError({ code: 'bad_header', message: 'The file holds no header row: the first row must name the columns' });
  }
}

/** Whitespace-only text counts as empty, the way a person looking at the sheet sees it. */
export function isBlank(value: CellValue): boolean {
  return value === null || (typeof value === 'string' && value.trim() === '');
}

function filledCells(cells: RawRow['cells']): RawRow['cells'] {
  const filled: RawRow['cells'][number][] = [];
  for (const cell of cells) if (!isBlank(cell.value)) filled.push(cell);
  return filled;
}

function readHeader(sheet: string, rowNumber: number, cells: RawRow['cells']): Header {
  const names: (string | undefined)[] = [];
  const emptyRow: Record<string, CellValue> = {};
  const columnOfName = new Map<string, number>();
  for (const { column, value } of cells) {
    if (typeof value !== 'string') {
      throw new ImportFileError({
        code: 'bad_header',
        message: `Sheet "${sheet}" has no header row: row ${rowNumber}, its first filled row, holds ${describe(value)} in column ${columnLetter(column)} where a column name belongs`,
        sheet,
        row: rowNumber,
        column: columnLetter(column),
      });
    }
    const name = value.trim();
    // Case is ignored: `span_length_m` and `Span_Length_M` would mean the same column to a reader.
    const earlier = columnOfName.get(name.toLowerCase());
    if (earlier !== undefined) {
      throw new ImportFileError({
        code: 'bad_header',
        message: `Sheet "${sheet}" names the column "${name}" twice in its header row ${rowNumber}: columns ${columnLetter(earlier)} and ${columnLetter(column)}`,
        sheet,
        row: rowNumber,
        column: columnLetter(column),
      });
    }
    columnOfName.set(name.toLowerCase(), column);
    names[column] = name;
    // Defined, not assigned, so a header such as "__proto__" is an own key; a copy keeps it one, and
    // assigning to an own key sets that key, never the prototype.
    Object.defineProperty(emptyRow, name, { value: null, writable: true, enumerable: true, configurable: true });
  }
  return { names, emptyRow };
}

/** The row's cells by header, or undefined when every cell is blank. */
function namedCells(raw: RawRow, header: Header): Record<string, CellValue> | undefined {
  let named: Record<string, CellValue> | undefined;
  for (const { column, value } of raw.cells) {
    if (isBlank(value)) continue;
    const name = header.names[column];
    if (name === undefined) {
      throw new ImportFileError({
        code: 'value_without_header',
        message: `Sheet "${raw.sheet}", row ${raw.rowNumber}, column ${columnLetter(column)} holds a value but the column has no name in the header row`,
        sheet: raw.sheet,
        row: raw.rowNumber,
        column: columnLetter(column),
      });
    }
    // A copy of one object for every row of the sheet: one shape, built without a map of entries.
    named ??= { ...header.emptyRow };
    named[name] = value;
  }
  return named;
}

function describe(value: CellValue): string {
  if (value instanceof Date) return 'a date';
  return `a ${typeof value}`;
}

/** 1 → A, 27 → AA: the letters spreadsheet programs show above columns. */
export function columnLetter(column: number): string {
  let letters = '';
  for (let rest = column; rest > 0; rest = Math.floor((rest - 1) / 26)) {
    letters = String.fromCharCode(65 + ((rest - 1) % 26)) + letters;
  }
  return letters;
}
