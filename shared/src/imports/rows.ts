import type { z } from 'zod';
import { BODY_CHECKS, type AssembledBody, type ImportBodies } from './bodies';
import * as cells from './cells';
import { cellText, type RawCell } from './cells';
import { IMPORT_TEMPLATES, type ImportColumn, type ImportTemplate, type ImportTemplateName } from './columns';

/**
 * Turning one parsed row of an import file into the API's body: read each cell as its column's
 * type, convert US customary values to SI, assemble the body and let the API's schema judge it.
 * Every problem names the sheet, the row, the column as the file spells it and the cell's value.
 */

/*
 * Local copies of what every cell is read with: compiled to CommonJS (tsx, jest), every use of an
 * imported binding is a getter call, which for the cells of a large file adds up.
 */
const CellRefusal = cells.CellRefusal;
const isEmptyCell = cells.isEmptyCell;
const readCell = cells.readCell;

/** One bad cell, row or header, as the preview and the error report list it. */
export interface ImportProblem {
  readonly sheet: string;
  /** The row number in the file (the header row for header problems). */
  readonly row: number;
  /** The column as it appears in the file; several joined by ", " for a key; "" for the row as a whole. */
  readonly column: string;
  readonly value: string | number | boolean | null;
  readonly message: string;
}

/** A row as the streaming CSV and XLSX readers yield it. */
export interface ParsedRow {
  readonly sheet: string;
  readonly rowNumber: number;
  readonly cells: Readonly<Record<string, RawCell>>;
}

interface HeaderUse {
  readonly column: ImportColumn;
  /** Given under the US customary header, so converted. */
  readonly inUsUnits: boolean;
}

/** A column the sheet gives, with what reading its cell in every row takes. */
interface GivenColumn extends HeaderUse {
  /** The header as the file spells it: the key of the column's cells. */
  readonly fileHeader: string;
}

/** What a sheet's header row says: which column each header is, and what is wrong with the headers. */
export interface HeaderReading {
  readonly template: ImportTemplate;
  readonly sheet: string;
  /** By the header exactly as the file spells it. */
  readonly uses: ReadonlyMap<string, HeaderUse>;
  /** The file's header for each column given, by the column's SI header. */
  readonly fileHeaders: ReadonlyMap<string, string>;
  readonly problems: readonly ImportProblem[];
  /** The columns given, in the template's order: what `convertRow` reads in every row of the sheet. */
  readonly givenColumns: readonly GivenColumn[];
  /** A required column is missing: no row of the sheet converts. */
  readonly missingRequired: boolean;
  /** The file's headers of the key columns, for naming them in a problem. */
  readonly keyColumns: string;
}

const normalised = (header: string) => header.trim().toLowerCase();

/** Every header a template accepts, normalised, with the column and unit system it stands for. */
function acceptedHeaders(template: ImportTemplate): Map<string, HeaderUse> {
  const accepted = new Map<string, HeaderUse>();
  for (const column of template.columns) {
    accepted.set(column.header, { column, inUsUnits: false });
    if (column.us !== null) accepted.set(column.us.header, { column, inUsUnits: true });
  }
  return accepted;
}

/**
 * Reads a sheet's header row. An unknown header, a header given twice and both unit systems of
 * one column are each a problem at that header; the required columns missing are one problem
 * for the sheet. Blank headers (trailing empty columns of a spreadsheet) are passed over.
 */
export function readHeaders(templateName: ImportTemplateName, sheet: string, headers: readonly string[], headerRowNumber = 1): HeaderReading {
  const template = IMPORT_TEMPLATES[templateName];
  const accepted = acceptedHeaders(template);
  const uses = new Map<string, HeaderUse>();
  const fileHeaders = new Map<string, string>();
  const problems: ImportProblem[] = [];
  const problem = (header: string, message: string) => problems.push({ sheet, row: headerRowNumber, column: header, value: header, message });

  for (const header of headers) {
    if (header.trim() === '') continue;
    const use = accepted.get(normalised(header));
    if (use === undefined) {
      problem(header, `unknown column for ${template.title.toLowerCase()}; data-import/README.md lists the columns`);
      continue;
    }
    const earlier = fileHeaders.get(use.column.header);
    if (earlier !== undefined) {
      problem(header, normalised(earlier) === normalised(header) ? 'the column appears twice' : `give ${earlier} or ${header}, not both`);
      continue;
    }
    uses.set(header, use);
    fileHeaders.set(use.column.header, header);
  }

  const missing = template.columns.filter((column) => column.required && !fileHeaders.has(column.header));
  if (missing.length > 0) {
    const names = missing.map((column) => (column.us === null ? column.header : `${column.header} (or ${column.us.header})`));
    problems.push({ sheet, row: headerRowNumber, column: missing.map((column) => column.header).join(', '), value: null, message: `required columns missing: ${names.join(', ')}` });
  }
  const givenColumns: GivenColumn[] = [];
  for (const column of template.columns) {
    const fileHeader = fileHeaders.get(column.header);
    if (fileHeader !== undefined) givenColumns.push({ column, fileHeader, inUsUnits: uses.get(fileHeader)!.inUsUnits });
  }
  const keyColumns = template.keyHeaders.map((header) => fileHeaders.get(header) ?? header).join(', ');
  return { template, sheet, uses, fileHeaders, problems, givenColumns, missingRequired: missing.length > 0, keyColumns };
}

export type RowConversion<T extends ImportTemplateName> =
  | { readonly ok: true; readonly row: ConvertedRow<T> }
  | { readonly ok: false; readonly problems: readonly ImportProblem[] };

/** A row that passed its template's checks, with its body and its key within the file. */
export interface ConvertedRow<T extends ImportTemplateName> {
  readonly template: T;
  readonly sheet: string;
  readonly rowNumber: number;
  readonly body: ImportBodies[T];
  /** The file's headers of the key columns, for naming them in a problem. */
  readonly keyColumns: string;
}

/** Puts a value at its place in the body, making the objects on the way. */
function setAt(target: Record<string, unknown>, path: readonly string[], value: unknown): void {
  let node = target;
  const last = path.length - 1;
  for (let depth = 0; depth < last; depth += 1) node = (node[path[depth]!] ??= {}) as Record<string, unknown>;
  node[path[last]!] = value;
}

const reportValue = (raw: RawCell): ImportProblem['value'] => (raw instanceof Date ? cellText(raw) : (raw ?? null));

function cellProblem(parsed: ParsedRow, column: string, raw: RawCell, message: string): ImportProblem {
  return { sheet: parsed.sheet, row: parsed.rowNumber, column, value: reportValue(raw), message };
}

/**
 * Converts one parsed row into its template's body, checked with the API's schema. Cells under
 * unknown or doubled headers are left out (their header is already a problem). A sheet missing
 * a required column converts no row: `readHeaders` reported it once, and every row is refused
 * with no problems of its own rather than one on every row.
 *
 * Run for every row of a large file: what the headers decide is worked out once in `readHeaders`,
 * and nothing here makes a function or a list a good row does not need.
 */
export function convertRow<T extends ImportTemplateName>(templateName: T, headers: HeaderReading, parsed: ParsedRow): RowConversion<T> {
  if (headers.missingRequired) return { ok: false, problems: [] };
  let problems: ImportProblem[] | undefined;
  const body: Record<string, unknown> = {};

  for (const { column, fileHeader, inUsUnits } of headers.givenColumns) {
    const raw = parsed.cells[fileHeader];
    if (isEmptyCell(raw)) {
      if (column.required) (problems ??= []).push(cellProblem(parsed, fileHeader, raw, 'is required'));
      continue;
    }
    const reading = readCell(column, raw, inUsUnits);
    if (reading instanceof CellRefusal) (problems ??= []).push(cellProblem(parsed, fileHeader, raw, reading.message));
    else setAt(body, column.path, reading);
  }
  if (templateName === 'girders') {
    const shapeMissing = sectionWithoutShape(headers, parsed, body);
    if (shapeMissing !== null) (problems ??= []).push(shapeMissing);
  }
  if (problems !== undefined) return { ok: false, problems };

  const check = BODY_CHECKS[templateName];
  check.putStandIns?.(body);
  const result = check.schema.safeParse(body);
  if (!result.success) return { ok: false, problems: schemaProblems(headers, parsed, result.error) };
  const checked = result.data as AssembledBody;
  check.takeStandInsOut?.(checked);
  return { ok: true, row: { template: templateName, sheet: parsed.sheet, rowNumber: parsed.rowNumber, body: checked as ImportBodies[T], keyColumns: headers.keyColumns } };
}

/** Custom-section dimensions with no shape would be dropped silently by the schema's shape choice; say so instead. */
function sectionWithoutShape(headers: HeaderReading, parsed: ParsedRow, body: AssembledBody): ImportProblem | null {
  const section = body.record?.['customSection'] as Record<string, unknown> | undefined;
  if (section === undefined || section['shape'] !== undefined) return null;
  const shapeHeader = headers.fileHeaders.get('section_shape') ?? 'section_shape';
  return { sheet: parsed.sheet, row: parsed.rowNumber, column: shapeHeader, value: null, message: 'section dimensions are given: choose the section shape they belong to (rectangle, tee or i-girder)' };
}

type SchemaIssue = z.core.$ZodIssue;

const startsWith = (path: readonly PropertyKey[], prefix: readonly PropertyKey[]) => prefix.every((key, index) => path[index] === key);

/**
 * The column a schema's complaint is about: the one at its path, else the nearest column above
 * it (a list item belongs to its list's column), else the first column inside it (a missing part).
 */
function columnAt(template: ImportTemplate, path: readonly PropertyKey[]): ImportColumn | null {
  const exact = template.columns.find((column) => column.path.length === path.length && startsWith(path, column.path));
  if (exact) return exact;
  const above = template.columns.filter((column) => startsWith(path, column.path)).sort((a, b) => b.path.length - a.path.length)[0];
  return above ?? template.columns.find((column) => startsWith(column.path, path)) ?? null;
}

/** A schema's complaint, worded for someone filling a spreadsheet. */
function wording(issue: SchemaIssue): string {
  if (issue.code === 'invalid_type' && /received undefined/.test(issue.message)) return 'is needed here, but the cell is empty';
  return issue.message;
}

function schemaProblems(headers: HeaderReading, parsed: ParsedRow, error: z.ZodError): ImportProblem[] {
  const problems: ImportProblem[] = [];
  for (const issue of error.issues) {
    // A key the schema does not know: each column of this shape that has no place in it.
    const paths = issue.code === 'unrecognized_keys' ? issue.keys.map((key) => [...issue.path, key]) : [issue.path];
    for (const path of paths) {
      const column = columnAt(headers.template, path);
      const fileHeader = column === null ? undefined : headers.fileHeaders.get(column.header);
      const inUsUnits = fileHeader !== undefined && headers.uses.get(fileHeader)!.inUsUnits;
      const message = issue.code === 'unrecognized_keys' ? 'this section shape does not use it; leave it empty' : wording(issue);
      problems.push({
        sheet: parsed.sheet,
        row: parsed.rowNumber,
        column: fileHeader ?? column?.header ?? '',
        value: fileHeader === undefined ? null : reportValue(parsed.cells[fileHeader]),
        message: inUsUnits && column?.unit ? `${message} (checked after conversion to ${column.unit.label})` : message,
      });
    }
  }
  return problems;
}
