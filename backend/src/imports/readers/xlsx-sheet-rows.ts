import type { CellValue, RawRow } from './sheet-table';
import { cellError, cellPosition, formulaWithoutValue, isoTextToDate, serialToDate, unreadable, type CellPosition } from './xlsx-cell-values';
import type { WorkbookLookups } from './xlsx-workbook-parts';
import * as xml from './xlsx-xml-scanner';
import type { XmlScanner } from './xlsx-xml-scanner';

/*
 * Local copies of the scanner's tokens and helpers: compiled to CommonJS (tsx, jest), every use of an
 * imported binding is a getter call, which in this per-tag loop costs more than the scanning.
 */
const TEXT = xml.TEXT;
const START_TAG = xml.START_TAG;
const END_TAG = xml.END_TAG;
const END_OF_PART = xml.END_OF_PART;
const decodeXmlText = xml.decodeXmlText;
const wholeNumberIn = xml.wholeNumberIn;

/** A cell's `t` attribute (ECMA-376 Part 1, 18.18.11); a cell without one holds a number. */
const NUMBER_CELL = 0;
const SHARED_STRING_CELL = 1;
const FORMULA_STRING_CELL = 2;
const INLINE_STRING_CELL = 3;
const BOOLEAN_CELL = 4;
const ERROR_CELL = 5;
const DATE_CELL = 6;
const UNKNOWN_CELL = 7;

/** Which text the scanner's TEXT tokens belong to. */
const NOT_COLLECTING = 0;
const COLLECTING_VALUE = 1;
const COLLECTING_INLINE_TEXT = 2;

const CHAR_C = 0x63;
const CHAR_V = 0x76;
const CHAR_F = 0x66;
const CHAR_T = 0x74;
const CHAR_R = 0x72;
const CHAR_S = 0x73;
const CHAR_I = 0x69;
/** XFD, the last column of a sheet (ECMA-376 Part 1, 18.3.1.4 limits). */
const MAX_COLUMN = 16384;

type RawCell = { column: number; value: CellValue };

/**
 * Reads one worksheet's rows (`<sheetData>`, ECMA-376 Part 1, 18.3.1) from a scanner fed the part's
 * text: `nextRow()` gives each row as soon as its end tag has been scanned, or undefined when the
 * scanner needs the next chunk. Cell values follow the import's rules: a formula's stored result,
 * never a calculation; a number in a date style becomes a Date; an error cell or a formula without a
 * stored result is refused, naming the cell.
 *
 * The state of the row and cell being read lives in fields, so scanning a cell creates nothing but
 * its value and its `{ column, value }`.
 */
export class SheetRowReader {
  private inSheetData = false;
  /** The cells of the row being read; undefined between rows. */
  private cells: RawCell[] | undefined;
  private rowNumber = 0;
  private lastColumn = 0;
  private cellsOutOfOrder = false;

  private inCell = false;
  private column = 0;
  private style = 0;
  private type = NUMBER_CELL;
  private hasFormula = false;
  private hasValue = false;
  private hasInlineString = false;
  private valueText = '';
  private inlineText = '';
  private collecting = NOT_COLLECTING;
  private inInlineString = false;
  private phoneticDepth = 0;

  constructor(
    private readonly scanner: XmlScanner,
    private readonly sheet: string,
    private readonly lookups: WorkbookLookups,
  ) {}

  nextRow(): RawRow | undefined {
    const scanner = this.scanner;
    for (;;) {
      const token = scanner.next();
      if (token === TEXT) {
        if (this.collecting === COLLECTING_VALUE) this.valueText += scanner.rawText();
        else if (this.collecting === COLLECTING_INLINE_TEXT) this.inlineText += scanner.rawText();
      } else if (token === START_TAG) {
        if (this.startElement()) return this.finishRow();
      } else if (token === END_TAG) {
        if (this.endElement()) return this.finishRow();
      } else {
        if (token === END_OF_PART && (this.cells !== undefined || this.inCell)) throw scanner.notUnderstood('it ends in the middle of a row');
        return undefined;
      }
    }
  }

  /** True when the element was a whole row written as `<row/>`. */
  private startElement(): boolean {
    const scanner = this.scanner;
    const nameLength = scanner.nameEnd - scanner.localNameStart;
    const first = scanner.source.charCodeAt(scanner.localNameStart);
    if (nameLength === 1) {
      if (this.inCell) this.startCellChild(first);
      else if (first === CHAR_C && this.cells !== undefined) this.startCell();
    } else if (nameLength === 3 && first === CHAR_R && scanner.localNameIs('row')) {
      if (this.cells !== undefined) throw scanner.notUnderstood('a row holds another row');
      if (this.inSheetData) {
        this.startRow();
        return scanner.selfClosing;
      }
    } else if (nameLength === 2 && first === CHAR_I && this.inCell && scanner.localNameIs('is')) {
      this.hasInlineString = true;
      this.inlineText = '';
      this.inInlineString = !scanner.selfClosing;
    } else if (nameLength === 3 && first === CHAR_R && this.inInlineString && scanner.localNameIs('rPh')) {
      if (!scanner.selfClosing) this.phoneticDepth += 1;
    } else if (nameLength === 9 && scanner.localNameIs('sheetData')) {
      this.inSheetData = !scanner.selfClosing;
    }
    return false;
  }

  private startCellChild(name: number): void {
    const selfClosing = this.scanner.selfClosing;
    if (name === CHAR_V) {
      this.hasValue = true;
      this.valueText = '';
      if (!selfClosing) this.collecting = COLLECTING_VALUE;
    } else if (name === CHAR_F) {
      // Shared formulas after the first cell are an empty `<f t="shared" si="0"/>`: still a formula.
      this.hasFormula = true;
    } else if (name === CHAR_T) {
      if (this.inInlineString && this.phoneticDepth === 0 && !selfClosing) this.collecting = COLLECTING_INLINE_TEXT;
    } else if (name === CHAR_C) {
      throw this.scanner.notUnderstood('a cell holds another cell');
    }
  }

  /** True when the element ended a row. */
  private endElement(): boolean {
    const scanner = this.scanner;
    const nameLength = scanner.nameEnd - scanner.localNameStart;
    const first = scanner.source.charCodeAt(scanner.localNameStart);
    if (nameLength === 1) {
      if (first === CHAR_C) {
        if (this.inCell) this.endCell();
      } else {
        // `</v>` or `</t>`; `</f>` and `</r>` end nothing being collected.
        this.collecting = NOT_COLLECTING;
      }
    } else if (nameLength === 3 && first === CHAR_R && scanner.localNameIs('row')) {
      if (this.inCell) throw scanner.notUnderstood('a row ends inside a cell');
      return this.cells !== undefined;
    } else if (nameLength === 2 && first === CHAR_I && scanner.localNameIs('is')) {
      this.inInlineString = false;
    } else if (nameLength === 3 && first === CHAR_R && this.inInlineString && scanner.localNameIs('rPh')) {
      this.phoneticDepth -= 1;
    } else if (nameLength === 9 && scanner.localNameIs('sheetData')) {
      this.inSheetData = false;
    }
    return false;
  }

  /** A row without `r` is the one after the previous row. */
  private startRow(): void {
    const scanner = this.scanner;
    let rowNumber = this.rowNumber + 1;
    while (scanner.nextAttribute()) {
      if (!scanner.attributeNameIs('r')) continue;
      rowNumber = scanner.attributeWholeNumber();
      if (rowNumber < 1) throw scanner.notUnderstood('a row has a damaged number');
    }
    this.rowNumber = rowNumber;
    this.cells = [];
    this.lastColumn = 0;
    this.cellsOutOfOrder = false;
  }

  private finishRow(): RawRow {
    let cells = this.cells!;
    this.cells = undefined;
    if (this.cellsOutOfOrder) cells = inColumnOrder(cells);
    return { sheet: this.sheet, rowNumber: this.rowNumber, cells };
  }

  /** A cell without `r` is in the column after the previous cell's. */
  private startCell(): void {
    const scanner = this.scanner;
    this.inCell = true;
    this.column = this.lastColumn + 1;
    this.style = 0;
    this.type = NUMBER_CELL;
    this.hasFormula = false;
    this.hasValue = false;
    this.hasInlineString = false;
    this.valueText = '';
    this.inlineText = '';
    this.inInlineString = false;
    this.phoneticDepth = 0;
    while (scanner.nextAttribute()) {
      if (scanner.attributeNameEnd - scanner.attributeNameStart !== 1) continue;
      const name = scanner.source.charCodeAt(scanner.attributeNameStart);
      if (name === CHAR_R) this.column = this.columnOfReference();
      else if (name === CHAR_S) this.style = scanner.attributeWholeNumber();
      else if (name === CHAR_T) this.type = this.cellType();
    }
    if (this.style < 0) throw scanner.notUnderstood('a cell has a damaged style number');
    if (this.column <= this.lastColumn) this.cellsOutOfOrder = true;
    this.lastColumn = this.column;
    if (scanner.selfClosing) this.endCell();
  }

  /** The column of a reference such as `AB12`: its letters, A = 1. */
  private columnOfReference(): number {
    const scanner = this.scanner;
    const source = scanner.source;
    let column = 0;
    let at = scanner.attributeValueStart;
    for (; at < scanner.attributeValueEnd; at += 1) {
      const code = source.charCodeAt(at) | 0x20; // lower case
      if (code < 0x61 || code > 0x7a) break;
      column = column * 26 + (code - 0x60);
    }
    if (column === 0 || column > MAX_COLUMN || wholeNumberIn(source, at, scanner.attributeValueEnd) < 1) {
      throw scanner.notUnderstood('a cell has a damaged reference');
    }
    return column;
  }

  private cellType(): number {
    const scanner = this.scanner;
    if (scanner.attributeValueIs('s')) return SHARED_STRING_CELL;
    if (scanner.attributeValueIs('n')) return NUMBER_CELL;
    if (scanner.attributeValueIs('str')) return FORMULA_STRING_CELL;
    if (scanner.attributeValueIs('inlineStr')) return INLINE_STRING_CELL;
    if (scanner.attributeValueIs('b')) return BOOLEAN_CELL;
    if (scanner.attributeValueIs('e')) return ERROR_CELL;
    if (scanner.attributeValueIs('d')) return DATE_CELL;
    return UNKNOWN_CELL;
  }

  /** Empty cells (`<c r="B2" s="1"/>`) are left out, as the header and row logic expect. */
  private endCell(): void {
    this.inCell = false;
    this.collecting = NOT_COLLECTING;
    this.inInlineString = false;
    if (!this.hasValue && !this.hasInlineString) {
      if (this.hasFormula) throw formulaWithoutValue(this.position());
      return;
    }
    this.cells!.push({ column: this.column, value: this.cellValue() });
  }

  private cellValue(): CellValue {
    const type = this.type;
    if (this.hasInlineString && (type === INLINE_STRING_CELL || !this.hasValue)) return this.decoded(this.inlineText);
    switch (type) {
      case NUMBER_CELL:
        return this.numberValue();
      case SHARED_STRING_CELL:
        return this.sharedString();
      case FORMULA_STRING_CELL:
      case INLINE_STRING_CELL:
        return this.decoded(this.valueText);
      case BOOLEAN_CELL:
        return this.booleanValue();
      case ERROR_CELL:
        throw cellError(this.position(), this.decoded(this.valueText).trim() || undefined);
      case DATE_CELL: {
        const date = isoTextToDate(this.decoded(this.valueText));
        if (date === undefined) throw unreadable(this.position());
        return date;
      }
      default:
        throw unreadable(this.position());
    }
  }

  private numberValue(): number | Date {
    const text = this.valueText;
    const number = Number(text);
    // Number('') and Number(' ') are 0, so blank text is caught here: a formula saved without
    // calculating may carry an empty `<v/>`, which is no stored value either.
    if (!Number.isFinite(number) || (number === 0 && text.trim() === '')) {
      throw this.hasFormula && text.trim() === '' ? formulaWithoutValue(this.position()) : unreadable(this.position());
    }
    return this.lookups.dateStyles[this.style] === true ? serialToDate(number, this.lookups.date1904) : number;
  }

  private sharedString(): string {
    const text = this.valueText;
    const index = wholeNumberIn(text, 0, text.length);
    const value = index < 0 ? undefined : this.lookups.sharedStrings[index];
    if (value === undefined) throw unreadable(this.position());
    return value;
  }

  private booleanValue(): boolean {
    const text = this.valueText.trim();
    if (text === '1' || text === 'true') return true;
    if (text === '0' || text === 'false') return false;
    throw unreadable(this.position());
  }

  private decoded(raw: string): string {
    const text = decodeXmlText(raw);
    if (text === undefined) throw unreadable(this.position());
    return text;
  }

  private position(): CellPosition {
    return cellPosition(this.sheet, this.rowNumber, this.column);
  }
}

/** Cells written out of column order come out in order; of two in one column the later wins, as it would in the sheet. */
function inColumnOrder(cells: readonly RawCell[]): RawCell[] {
  const byColumn = new Map<number, RawCell>();
  for (const cell of cells) byColumn.set(cell.column, cell);
  return [...byColumn.values()].sort(byColumnNumber);
}

function byColumnNumber(a: RawCell, b: RawCell): number {
  return a.column - b.column;
}
