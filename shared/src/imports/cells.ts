import { usToSi, type ImportColumn } from './columns';

/** A cell as the CSV and XLSX readers hand it over. */
export type RawCell = string | number | boolean | Date | null | undefined;

/**
 * Why a cell cannot be read as its column's type. A reading is the value itself or one of these,
 * so reading the cells of a large file makes no wrapper object per cell.
 */
export class CellRefusal {
  constructor(readonly message: string) {}
}

const NUMBER_TEXT = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
const YES = new Set(['yes', 'true', 'y']);
const NO = new Set(['no', 'false', 'n']);
const NOT_A_NUMBER = new CellRefusal('expected a number');
const NOT_A_WHOLE_NUMBER = new CellRefusal('expected a whole number');
const NOT_YES_OR_NO = new CellRefusal('expected yes or no');
const NOT_A_DATE = new CellRefusal('expected a date YYYY-MM-DD');

export function isEmptyCell(raw: RawCell): boolean {
  return raw === null || raw === undefined || (typeof raw === 'string' && raw.trim() === '');
}

/** YYYY-MM-DD of a date from a spreadsheet, whose readers give a day as midnight UTC. */
function isoDay(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** The cell as text, for reports and text columns. */
export function cellText(raw: RawCell): string {
  if (raw === null || raw === undefined) return '';
  if (raw instanceof Date) return Number.isNaN(raw.getTime()) ? '' : isoDay(raw);
  return String(raw).trim();
}

function readNumber(raw: RawCell, wholeOnly: boolean): number | CellRefusal {
  const refusal = wholeOnly ? NOT_A_WHOLE_NUMBER : NOT_A_NUMBER;
  let value: number;
  if (typeof raw === 'number') value = raw;
  else if (typeof raw === 'string') {
    const text = raw.trim();
    if (!NUMBER_TEXT.test(text)) return refusal;
    value = Number(text);
  } else return refusal;
  if (!Number.isFinite(value) || (wholeOnly && !Number.isInteger(value))) return refusal;
  return value;
}

/** A list cell's numbers in the column's SI unit, items becoming objects where the column says so. */
function readList(column: ImportColumn, raw: RawCell, inUsUnits: boolean): unknown[] | CellRefusal {
  const wholeOnly = column.type === 'whole-number-list';
  const items = typeof raw === 'number' ? [raw] : cellText(raw).split(';');
  const values: unknown[] = [];
  for (const each of items) {
    // Empty items (a trailing ";") are passed over, and not counted when an item is named.
    const item = typeof each === 'number' ? each : each.trim();
    if (item === '') continue;
    const reading = readNumber(item, wholeOnly);
    if (reading instanceof CellRefusal) return new CellRefusal(`item ${values.length + 1} ("${item}"): ${reading.message}; separate items with ";"`);
    const value = inUsUnits ? usToSi(column, reading) : reading;
    values.push(column.listItemKey === null ? value : { [column.listItemKey]: value });
  }
  return values;
}

function readYesNo(raw: RawCell): boolean | CellRefusal {
  if (typeof raw === 'boolean') return raw;
  const text = cellText(raw).toLowerCase();
  if (YES.has(text)) return true;
  if (NO.has(text)) return false;
  return NOT_YES_OR_NO;
}

function readDate(raw: RawCell): string | CellRefusal {
  if (raw instanceof Date) return Number.isNaN(raw.getTime()) ? NOT_A_DATE : isoDay(raw);
  // A bare number is a spreadsheet's day count that lost its date format: ambiguous, so refused.
  if (typeof raw !== 'string') return NOT_A_DATE;
  return raw.trim();
}

function readChoice(raw: RawCell, choices: readonly string[]): string | CellRefusal {
  const text = cellText(raw).toLowerCase();
  return choices.includes(text) ? text : new CellRefusal(`expected one of: ${choices.join(', ')}`);
}

/**
 * Reads a non-empty cell as its column's type: the value for the body, or a `CellRefusal`. A value
 * under a US customary header is converted to the column's SI unit.
 */
export function readCell(column: ImportColumn, raw: RawCell, inUsUnits: boolean): unknown {
  switch (column.type) {
    case 'text':
      return cellText(raw);
    case 'number':
    case 'whole-number': {
      const reading = readNumber(raw, column.type === 'whole-number');
      return inUsUnits && typeof reading === 'number' ? usToSi(column, reading) : reading;
    }
    case 'number-list':
    case 'whole-number-list':
      return readList(column, raw, inUsUnits);
    case 'yes-no':
      return readYesNo(raw);
    case 'date':
      return readDate(raw);
    case 'choice':
      return readChoice(raw, column.choices ?? []);
  }
}
