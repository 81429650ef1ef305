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

/** Header texts by column number. */
type Header = ReadonlyMap<number, string>;

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
    const cells = raw.cells.filter((cell) => !isBlank(cell.value));
    if (cells.length === 0) continue;
    if (!header) {
      header = readHeader(raw.sheet, raw.rowNumber, cells);
      sawHeader = true;
      continue;
    }
    yield { sheet: raw.sheet, rowNumber: raw.rowNumber, cells: namedCells(raw, cells, header) };
  }
  if (!sawHeader) {
    throw new ImportFileError({ code: 'bad_header', message: 'The file holds no header row: the first row must name the columns' });
  }
}

/** Whitespace-only text counts as empty, the way a person looking at the sheet sees it. */
export function isBlank(value: CellValue): boolean {
  return value === null || (typeof value === 'string' && value.trim() === '');
}

function readHeader(sheet: string, rowNumber: number, cells: RawRow['cells']): Header {
  const header = new Map<number, string>();
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
    header.set(column, name);
  }
  return header;
}

function namedCells(raw: RawRow, cells: RawRow['cells'], header: Header): Record<string, CellValue> {
  const named = new Map<string, CellValue>([...header.values()].map((name) => [name, null]));
  for (const { column, value } of cells) {
    const name = header.get(column);
    if (name === undefined) {
      throw new ImportFileError({
        code: 'value_without_header',
        message: `Sheet "${raw.sheet}", row ${raw.rowNumber}, column ${columnLetter(column)} holds a value but the column has no name in the header row`,
        sheet: raw.sheet,
        row: raw.rowNumber,
        column: columnLetter(column),
      });
    }
    named.set(name, value);
  }
  // fromEntries defines own properties, so a header such as "__proto__" stays an ordinary key.
  return Object.fromEntries(named);
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
