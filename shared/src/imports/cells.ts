import { usToSi, type ImportColumn } from './columns';

/** A cell as the CSV and XLSX readers hand it over. */
export type RawCell = string | number | boolean | Date | null | undefined;

/** A cell read as its column's type, in SI: the value for the body, or why it cannot be read. */
export type CellReading = { readonly ok: true; readonly value: unknown } | { readonly ok: false; readonly message: string };

const NUMBER_TEXT = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
const YES = new Set(['yes', 'true', 'y']);
const NO = new Set(['no', 'false', 'n']);

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

function readNumber(raw: RawCell, wholeOnly: boolean): CellReading {
  const expected = wholeOnly ? 'expected a whole number' : 'expected a number';
  let value: number;
  if (typeof raw === 'number') value = raw;
  else if (typeof raw === 'string' && NUMBER_TEXT.test(raw.trim())) value = Number(raw.trim());
  else return { ok: false, message: expected };
  if (!Number.isFinite(value) || (wholeOnly && !Number.isInteger(value))) return { ok: false, message: expected };
  return { ok: true, value };
}

function readList(raw: RawCell, wholeOnly: boolean): CellReading {
  const items = typeof raw === 'number' ? [raw] : cellText(raw).split(';').map((item) => item.trim()).filter((item) => item !== '');
  const values: number[] = [];
  for (const [index, item] of items.entries()) {
    const reading = readNumber(item, wholeOnly);
    if (!reading.ok) return { ok: false, message: `item ${index + 1} ("${item}"): ${reading.message}; separate items with ";"` };
    values.push(reading.value as number);
  }
  return { ok: true, value: values };
}

function readYesNo(raw: RawCell): CellReading {
  if (typeof raw === 'boolean') return { ok: true, value: raw };
  const text = cellText(raw).toLowerCase();
  if (YES.has(text)) return { ok: true, value: true };
  if (NO.has(text)) return { ok: true, value: false };
  return { ok: false, message: 'expected yes or no' };
}

function readDate(raw: RawCell): CellReading {
  if (raw instanceof Date) return Number.isNaN(raw.getTime()) ? { ok: false, message: 'expected a date YYYY-MM-DD' } : { ok: true, value: isoDay(raw) };
  // A bare number is a spreadsheet's day count that lost its date format: ambiguous, so refused.
  if (typeof raw !== 'string') return { ok: false, message: 'expected a date YYYY-MM-DD' };
  return { ok: true, value: raw.trim() };
}

function readChoice(raw: RawCell, choices: readonly string[]): CellReading {
  const text = cellText(raw).toLowerCase();
  return choices.includes(text) ? { ok: true, value: text } : { ok: false, message: `expected one of: ${choices.join(', ')}` };
}

/** Reads a non-empty cell as its column's type; a value under a US customary header is converted to the column's SI unit. */
export function readCell(column: ImportColumn, raw: RawCell, inUsUnits: boolean): CellReading {
  const toSi = (value: number) => (inUsUnits ? usToSi(column, value) : value);
  switch (column.type) {
    case 'text':
      return { ok: true, value: cellText(raw) };
    case 'number':
    case 'whole-number': {
      const reading = readNumber(raw, column.type === 'whole-number');
      return reading.ok ? { ok: true, value: toSi(reading.value as number) } : reading;
    }
    case 'number-list':
    case 'whole-number-list': {
      const reading = readList(raw, column.type === 'whole-number-list');
      if (!reading.ok) return reading;
      const values = (reading.value as number[]).map(toSi);
      return { ok: true, value: column.listItemKey === null ? values : values.map((value) => ({ [column.listItemKey!]: value })) };
    }
    case 'yes-no':
      return readYesNo(raw);
    case 'date':
      return readDate(raw);
    case 'choice':
      return readChoice(raw, column.choices ?? []);
  }
}
