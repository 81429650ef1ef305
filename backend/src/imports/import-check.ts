import { isDeepStrictEqual } from 'node:util';
import {
  COLUMNS_SHEET_NAME,
  IMPORT_TEMPLATE_NAMES,
  IMPORT_TEMPLATES,
  canInDistrict,
  checkUpload,
  convertRow,
  girderKey,
  readHeaders,
  spanKey,
  templateNamed,
  type Action,
  type AnyConvertedRow,
  type ConvertedRow,
  type GirderRecord,
  type HeaderReading,
  type ImportCounts,
  type ImportProblem,
  type ImportTemplateName,
  type SignedInUser,
  type StrandRow,
} from '../../../shared/src';
import type { Database, Transaction } from '../db/database';
import { toGirderRecord } from '../girders/girder-record';
import type { StoredSpan } from '../girders/girder-calc-file';
import { findGirdersOfSpans, findGirderTypes, findStrandRowsOfGirders, type GirderRow, type GirderTypeRow } from '../girders/girders.repository';
import { girderRatingProblems, girderRecordDigest } from '../girders/girders.service';
import { findFindingsOfInspection, findInspectionsOfStructures, type FindingRow, type InspectionRow } from '../inspections/inspections.repository';
import { findingsMisfitOnGirder, importedFindingOutcomeInDraft, placeOfImportedFindings } from '../inspections/inspections.service';
import { findPriorRatingsOfStructures, type PriorRatingRow } from '../prior-ratings/prior-ratings.repository';
import { priorRatingMisfit } from '../prior-ratings/prior-ratings.service';
import { findSpansOfStructures, type SpanRow } from '../spans/spans.repository';
import { spanColumnsOf, editableFields as spanFields } from '../spans/spans.service';
import { findStructuresByNumbers, type StructureRow } from '../structures/structures.repository';
import { editableFields as structureFields } from '../structures/structures.service';
import { newSpanFields } from './import-commit';
import { findingColumnOf } from './import-write-findings';
import { priorRatingColumnOf } from './import-write-prior-ratings';
import { readRows } from './readers/read-rows';

type Db = Database | Transaction;

/** What an upload would do, and every problem that stops it. Nothing is written while checking. */
export interface UploadJudgement {
  readonly counts: Partial<Record<ImportTemplateName, ImportCounts>>;
  readonly problems: ImportProblem[];
  readonly rows: readonly AnyConvertedRow[];
  /** Digests of what the engine passed (`girderRatingProblems`): the commit need not check the same girders again. */
  readonly rateableGirders: ReadonlySet<string>;
  /** How many girders the file gives each span, by span key: what the commit creates a new span with. */
  readonly girdersPerSpan: ReadonlyMap<string, number>;
  /** Each girders row's `girderRecordDigest`, kept with the row for the commit's own check. */
  readonly recordDigests: ReadonlyMap<AnyConvertedRow, string>;
}

/** Who may import each template (product.md, permission matrix): inventory by its editors, findings by inspectors and raters, prior ratings by those who run ratings — they are ratings of record. */
const ACTION_OF: Readonly<Record<ImportTemplateName, Action>> = {
  structures: 'editInventory',
  spans: 'editInventory',
  girders: 'editInventory',
  'strand-rows': 'editInventory',
  findings: 'importFindings',
  'prior-ratings': 'runRatings',
};

/**
 * Reads every row of the file and checks it against its template (a sheet is named after its
 * template; a CSV file holds the template given), then the rows against each other. Problems
 * are collected rather than thrown, so the person sees all of them at once.
 */
export async function readAndConvert(filePath: string, csvTemplate: ImportTemplateName | null): Promise<{ rows: AnyConvertedRow[]; problems: ImportProblem[]; sheets: string[]; fileRows: FileRows }> {
  const rows: AnyConvertedRow[] = [];
  const problems: ImportProblem[] = [];
  const fileRows = new Map<ImportTemplateName, number>();
  const headersBySheet = new Map<string, { template: ImportTemplateName; headers: HeaderReading } | null>();
  for await (const row of readRows(filePath, csvTemplate ? { sheetName: csvTemplate } : {})) {
    // The template workbook's own description of its columns, left in a filled-in template.
    if (row.sheet === COLUMNS_SHEET_NAME) continue;
    let sheet = headersBySheet.get(row.sheet);
    if (sheet === undefined) {
      const template = templateNamed(row.sheet);
      if (!template) {
        problems.push({ sheet: row.sheet, row: 0, column: '', value: row.sheet, message: `a sheet must be named after its template: ${IMPORT_TEMPLATE_NAMES.join(', ')}` });
        sheet = null;
      } else {
        const headers = readHeaders(template, row.sheet, Object.keys(row.cells));
        problems.push(...headers.problems);
        sheet = { template, headers };
      }
      headersBySheet.set(row.sheet, sheet);
    }
    if (!sheet) continue;
    fileRows.set(sheet.template, (fileRows.get(sheet.template) ?? 0) + 1);
    const converted = convertRow(sheet.template, sheet.headers, row);
    if (converted.ok) rows.push(converted.row as AnyConvertedRow);
    else problems.push(...converted.problems);
  }
  const acrossRows = checkUpload(rows);
  problems.push(...acrossRows.problems);
  return { rows, problems, sheets: [...headersBySheet.keys()], fileRows };
}

/** How many data rows of each template the file holds, whatever becomes of them. */
export type FileRows = ReadonlyMap<ImportTemplateName, number>;

/**
 * The counts with each template's refused rows — those with a problem at a data row of one of its
 * sheets, each row once — and its rows in the file (when the file was read to its end). A
 * template whose every row was refused at its cells gets counts of its own. Problems of a header
 * row, of a sheet as a whole or of the file are at no data row.
 */
export function withRefusedRows(counts: UploadJudgement['counts'], problems: readonly ImportProblem[], fileRows: FileRows): Partial<Record<ImportTemplateName, ImportCounts>> {
  const refusedRows = new Map<ImportTemplateName, Set<string>>();
  for (const problem of problems) {
    const template = problem.row > HEADER_ROW ? templateNamed(problem.sheet) : null;
    if (!template) continue;
    const rows = refusedRows.get(template) ?? new Set<string>();
    rows.add(`${problem.sheet}\u0000${problem.row}`);
    refusedRows.set(template, rows);
  }
  const templates = IMPORT_TEMPLATE_NAMES.filter((template) => counts[template] || refusedRows.has(template));
  const countsOf = (template: ImportTemplateName): ImportCounts => {
    const inFile = fileRows.get(template);
    return { ...(counts[template] ?? NO_ROWS_JUDGED), refused: refusedRows.get(template)?.size ?? 0, ...(inFile === undefined ? {} : { fileRows: inFile }) };
  };
  return Object.fromEntries(templates.map((template) => [template, countsOf(template)]));
}

/** A sheet's header row: its data rows come after it. */
const HEADER_ROW = 1;
const NO_ROWS_JUDGED: ImportCounts = { rows: 0, create: 0, update: 0, unchanged: 0 };

/**
 * The problems as the person fixing the file goes through it: sheet by sheet in the file's order,
 * row by row; within a row, in the order found. Problems of the file as a whole come first.
 */
export function inFileOrder(problems: readonly ImportProblem[], sheets: readonly string[]): ImportProblem[] {
  const rankOf = new Map(sheets.map((sheet, index) => [sheet, index]));
  const rank = (sheet: string) => (sheet === '' ? -1 : (rankOf.get(sheet) ?? sheets.length));
  return [...problems].sort((a, b) => rank(a.sheet) - rank(b.sheet) || a.row - b.row);
}

const problemAt = (row: AnyConvertedRow, column: string, value: ImportProblem['value'], message: string): ImportProblem => ({ sheet: row.sheet, row: row.rowNumber, column, value, message });

/** Memoizes a key of an object by the object: worked out once, looked up after. */
function memoizedBy<T extends object>(keyOf: (value: T) => string): (value: T) => string {
  const known = new WeakMap<T, string>();
  return (value) => {
    let key = known.get(value);
    if (key === undefined) {
      key = keyOf(value);
      known.set(value, key);
    }
    return key;
  };
}

/** The keys of a row's span and girder, worked out once per row body: the check looks each up many times, and each is JSON text to make. */
const spanKeyOf = memoizedBy(spanKey);
const girderKeyOf = memoizedBy(girderKey);

/** The register as the upload touches it, read in a few queries. */
interface Register {
  readonly structures: ReadonlyMap<string, StructureRow>;
  readonly spans: ReadonlyMap<string, SpanRow>;
  readonly girders: ReadonlyMap<string, GirderRow>;
  readonly strandRows: ReadonlyMap<number, Parameters<typeof toGirderRecord>[1]>;
  readonly girderTypeIds: ReadonlyMap<string, number>;
  readonly girderTypes: ReadonlyMap<number, GirderTypeRow>;
  /** The inspections of the structures the file has findings for, by structure number, oldest first. */
  readonly inspections: ReadonlyMap<string, readonly InspectionRow[]>;
  /** The findings of the user's own drafts among them, by inspection id: an imported finding may change one. */
  readonly draftFindings: ReadonlyMap<number, readonly FindingRow[]>;
  /** The prior ratings of the structures the file has prior ratings for, by structure number. */
  readonly priorRatings: ReadonlyMap<string, readonly PriorRatingRow[]>;
}

/** Adds an item to its key's list, starting the list when it is the first. */
function addTo<K, V>(lists: Map<K, V[]>, key: K, item: V): void {
  const list = lists.get(key);
  if (list) list.push(item);
  else lists.set(key, [item]);
}

/** The stored rows of the structures a template's rows name, by structure number. */
function byStructureNumber<T extends { structure_id: number }>(stored: readonly T[], structures: ReadonlyMap<string, StructureRow>): Map<string, T[]> {
  const numberOf = new Map([...structures.values()].map((structure) => [structure.id, structure.structure_number]));
  const grouped = new Map<string, T[]>();
  for (const row of stored) addTo(grouped, numberOf.get(row.structure_id)!, row);
  return grouped;
}

const storedIdsNamedBy = (rows: readonly AnyConvertedRow[], template: ImportTemplateName, structures: ReadonlyMap<string, StructureRow>) => [
  ...new Set(rows.flatMap((row) => (row.template === template ? (structures.get(row.body.structureNumber)?.id ?? []) : []))),
];

async function readRegister(db: Db, user: SignedInUser, rows: readonly AnyConvertedRow[]): Promise<Register> {
  const numbers = [...new Set(rows.map((row) => row.body.structureNumber))];
  const structureRows = await findStructuresByNumbers(db, numbers);
  const structures = new Map(structureRows.map((row) => [row.structure_number, row]));
  const numberOf = new Map(structureRows.map((row) => [row.id, row.structure_number]));
  const spanRows = await findSpansOfStructures(db, structureRows.map((row) => row.id));
  const spans = new Map(spanRows.map((row) => [spanKey({ structureNumber: numberOf.get(row.structure_id)!, spanIndex: row.span_index }), row]));
  const girderRows = await findGirdersOfSpans(db, spanRows.map((row) => row.id));
  const girders = new Map(girderRows.map((row) => [girderKey({ structureNumber: row.structure_number, spanIndex: row.span_index, girderNumber: row.girder_number }), row]));
  const strandRows = await findStrandRowsOfGirders(db, girderRows.map((row) => row.id));
  const girderTypeRows = await findGirderTypes(db);
  const girderTypeIds = new Map(girderTypeRows.map((type) => [type.name.toLowerCase(), type.id]));
  const girderTypes = new Map(girderTypeRows.map((type) => [type.id, type]));
  const inspectionRows = await findInspectionsOfStructures(db, storedIdsNamedBy(rows, 'findings', structures));
  const draftFindings = new Map<number, FindingRow[]>();
  for (const draft of inspectionRows.filter((inspection) => inspection.inspector_id === user.id && (inspection.state === 'draft' || inspection.state === 'returned'))) {
    draftFindings.set(draft.id, await findFindingsOfInspection(db, draft.id));
  }
  const priorRatings = byStructureNumber(await findPriorRatingsOfStructures(db, storedIdsNamedBy(rows, 'prior-ratings', structures)), structures);
  return { structures, spans, girders, strandRows, girderTypeIds, girderTypes, inspections: byStructureNumber(inspectionRows, structures), draftFindings, priorRatings };
}

type Outcome = 'create' | 'update' | 'unchanged';

/** Whether the stored fields already say what the row says (only the fields the row gives). */
function sameAs(stored: Record<string, unknown>, given: Record<string, unknown>): boolean {
  return Object.entries(given).every(([field, value]) => isDeepStrictEqual(stored[field] ?? null, value ?? null));
}

interface Judged {
  readonly outcome: Outcome | null;
  readonly problems: readonly ImportProblem[];
}

const ok = (outcome: Outcome): Judged => ({ outcome, problems: [] });
const refused = (...problems: ImportProblem[]): Judged => ({ outcome: null, problems });

/** The district a row's structure is in: the file's for a structure row, else the register's. */
function districtOf(row: AnyConvertedRow, register: Register, structuresInFile: ReadonlyMap<string, string>): string | undefined {
  if (row.template === 'structures') return row.body.district;
  return register.structures.get(row.body.structureNumber)?.district ?? structuresInFile.get(row.body.structureNumber);
}

function judgeStructure(row: ConvertedRow<'structures'>, register: Register, user: SignedInUser): Judged {
  const stored = register.structures.get(row.body.structureNumber);
  if (stored && !canInDistrict(user, 'editInventory', stored.district)) {
    return refused(problemAt(row, row.keyColumns, row.body.structureNumber, `is in ${stored.district}, where you may not change the inventory`));
  }
  if (!stored) return ok('create');
  return ok(sameAs(structureFields(stored), row.body) ? 'unchanged' : 'update');
}

function judgeSpan(row: ConvertedRow<'spans'>, register: Register, inFile: FileFacts): Judged {
  const stored = register.spans.get(spanKeyOf(row.body));
  if (stored) return ok(sameAs(spanFields(stored), row.body.span) ? 'unchanged' : 'update');
  if (!register.structures.has(row.body.structureNumber) && !inFile.structures.has(row.body.structureNumber)) {
    return refused(problemAt(row, row.keyColumns, row.body.structureNumber, `structure ${row.body.structureNumber} is not in the register, and no valid structures row of this file adds it`));
  }
  const girders = inFile.girdersPerSpan.get(spanKeyOf(row.body)) ?? 0;
  if (girders < MIN_GIRDERS_OF_NEW_SPAN) {
    return refused(problemAt(row, row.keyColumns, `${row.body.structureNumber} span ${row.body.spanIndex}`, `a new span needs its girders (at least two) in the same file; this file gives it ${girders}`));
  }
  return ok('create');
}

/** A span carries at least two girders (the database's own rule); a new one gets them from the same file. */
const MIN_GIRDERS_OF_NEW_SPAN = 2;

function judgeGirder(row: ConvertedRow<'girders'>, register: Register, inFile: FileFacts): Judged {
  const { girderTypeName } = row.body;
  const girderTypeId = girderTypeName === null ? null : register.girderTypeIds.get(girderTypeName.toLowerCase());
  if (girderTypeId === undefined) return refused(problemAt(row, 'girder_type', girderTypeName, 'is not a girder type of the catalogue; add it there first, or give the section'));
  const stored = register.girders.get(girderKeyOf(row.body));
  if (!stored && !register.spans.has(spanKeyOf(row.body)) && !inFile.spans.has(spanKeyOf(row.body))) {
    return refused(problemAt(row, row.keyColumns, `${row.body.structureNumber} span ${row.body.spanIndex}`, 'this span is not in the register, and no valid spans row of this file adds it'));
  }
  const fileStrandRows = inFile.strandRowRows.get(girderKeyOf(row.body));
  const record: GirderRecord = { ...row.body.record, girderTypeId, strandRows: fileStrandRows ? fileStrandRows.map((each) => each.body.strandRow) : storedStrandRows(register, stored) };
  const recordDigest = girderRecordDigest(record);
  if (recordDigest !== null) inFile.recordDigests.set(row, recordDigest);
  const unrateable = ratingProblems(row, record, register, inFile, recordDigest);
  if (unrateable.length > 0) return refused(...unrateable);
  if (!stored) return ok('create');
  const { strandRows: _strandRows, ...storedRecord } = toGirderRecord(stored, register.strandRows.get(stored.id) ?? []);
  return ok(sameAs(storedRecord, { ...row.body.record, girderTypeId }) ? 'unchanged' : 'update');
}

const storedStrandRows = (register: Register, stored: GirderRow | undefined): StrandRow[] => (stored ? toGirderRecord(stored, register.strandRows.get(stored.id) ?? []).strandRows : []);

/**
 * What the engine would refuse in the girder as the commit writes it — its record, its strand
 * rows from the file (or those stored), on its span and structure as the file leaves them — by
 * the same rules as the API, each problem at the file's cell where one stands for it: the
 * preview names what would otherwise fail the commit. A file's girders are often alike, so a
 * girder already passed is known by its digest (`inFile.rateableGirders`).
 */
function ratingProblems(
  row: ConvertedRow<'girders'> | ConvertedRow<'strand-rows'>,
  record: GirderRecord,
  register: Register,
  inFile: FileFacts,
  recordDigest?: string | null,
): ImportProblem[] {
  const span = spanAsFileLeavesIt(register, inFile, row.body);
  if (!span) return [];
  const type = record.girderTypeId === null ? undefined : register.girderTypes.get(record.girderTypeId);
  const fields = girderRatingProblems(record, type, span, row.body.girderNumber, skewAsFileLeavesIt(register, inFile, row.body.structureNumber), inFile.rateableGirders, recordDigest);
  return fields.map((field) => girderProblemAt(row, field, inFile.strandRowRows.get(girderKeyOf(row.body))));
}

/**
 * The span a girder is rated on once the commit has written the file's spans row, if it has one;
 * the girder count a new span starts with is its girders in the file. Worked out once a span: its
 * girders share it.
 */
function spanAsFileLeavesIt(register: Register, inFile: FileFacts, key: { structureNumber: string; spanIndex: number }): StoredSpan | null {
  const known = inFile.spansAsLeft.get(spanKeyOf(key));
  if (known !== undefined) return known;
  const span = spanAfterFile(register, inFile, key);
  inFile.spansAsLeft.set(spanKeyOf(key), span);
  return span;
}

function spanAfterFile(register: Register, inFile: FileFacts, key: { structureNumber: string; spanIndex: number }): StoredSpan | null {
  const stored = register.spans.get(spanKeyOf(key));
  const fileRow = inFile.spanRows.get(spanKeyOf(key));
  if (stored) return fileRow ? { ...stored, ...spanColumnsOf(fileRow.body.span) } : stored;
  if (!fileRow) return null;
  return { ...(spanColumnsOf(newSpanFields(fileRow)) as Omit<StoredSpan, 'girder_count'>), girder_count: inFile.girdersPerSpan.get(spanKeyOf(key)) ?? 0 };
}

function skewAsFileLeavesIt(register: Register, inFile: FileFacts, structureNumber: string): number {
  return inFile.structureRows.get(structureNumber)?.body.skewDeg ?? register.structures.get(structureNumber)?.skew_deg ?? 0;
}

/**
 * A problem the girder's record has, at the file's cell: a strand row's field at its row of the
 * strand-rows sheet, any other field at its column of the girders row; else at the row's key.
 */
function girderProblemAt(row: ConvertedRow<'girders'> | ConvertedRow<'strand-rows'>, field: { field: string; message: string }, fileStrandRows: readonly ConvertedRow<'strand-rows'>[] | undefined): ImportProblem {
  const [head, index, ...rest] = field.field.split('.');
  const strandRowRow = head === 'strandRows' ? fileStrandRows?.[Number(index)] : undefined;
  if (strandRowRow) {
    const column = columnAtPath('strand-rows', ['strandRow', ...rest]);
    return column ? problemAt(strandRowRow, column.header, valueAt(strandRowRow.body, column.path), field.message) : problemAt(strandRowRow, strandRowRow.keyColumns, null, `${rest.join('.') || 'strand row'}: ${field.message}`);
  }
  if (row.template === 'girders') {
    const column = field.field === 'girderTypeId' ? columnAtPath('girders', ['girderTypeName']) : columnAtPath('girders', ['record', ...field.field.split('.')]);
    if (column) return problemAt(row, column.header, valueAt(row.body, column.path), field.message);
  }
  return problemAt(row, row.keyColumns, null, `${field.field}: ${field.message}`);
}

/** The template's column whose body path is `path`, or the nearest one above it. */
function columnAtPath(template: ImportTemplateName, path: readonly string[]) {
  const startsWith = (whole: readonly string[], start: readonly string[]) => start.every((key, at) => whole[at] === key);
  return IMPORT_TEMPLATES[template].columns.filter((column) => startsWith(path, column.path)).sort((a, b) => b.path.length - a.path.length)[0];
}

function judgeStrandRows(row: ConvertedRow<'strand-rows'>, register: Register, inFile: FileFacts): Judged {
  if (inFile.girders.has(girderKeyOf(row.body))) return ok('create');
  const stored = register.girders.get(girderKeyOf(row.body));
  if (stored) {
    // Strand rows of a girder the file does not otherwise give replace the stored ones: judged with the stored girder, once, at its first strand row.
    const fileStrandRows = inFile.strandRowRows.get(girderKeyOf(row.body))!;
    if (fileStrandRows[0] !== row) return ok('create');
    const unrateable = ratingProblems(row, { ...toGirderRecord(stored, []), strandRows: fileStrandRows.map((each) => each.body.strandRow) }, register, inFile);
    return unrateable.length > 0 ? refused(...unrateable) : ok('create');
  }
  const { structureNumber, spanIndex, girderNumber } = row.body;
  return refused(problemAt(row, row.keyColumns, `${structureNumber} span ${spanIndex} girder ${girderNumber}`, 'this girder is not in the register, and no valid girders row of this file adds it'));
}

/** What the file says that a finding's girder, as the file leaves it, is checked against: the girders, spans and strand rows it writes. */
interface FileFacts {
  readonly structures: ReadonlySet<string>;
  readonly spans: ReadonlySet<string>;
  readonly girders: ReadonlySet<string>;
  /** The strand rows the file gives, by girder: they replace the stored ones. */
  readonly strandRowIds: ReadonlyMap<string, readonly string[]>;
  /** The same strand rows as the file's rows, by girder, in file order. */
  readonly strandRowRows: ReadonlyMap<string, readonly ConvertedRow<'strand-rows'>[]>;
  /** The rows of the structures and spans the file gives: girders are rated on them as the file leaves them. */
  readonly structureRows: ReadonlyMap<string, ConvertedRow<'structures'>>;
  readonly spanRows: ReadonlyMap<string, ConvertedRow<'spans'>>;
  /** How many girders the file gives each span: what a new span starts with. */
  readonly girdersPerSpan: ReadonlyMap<string, number>;
  /** Girders the engine has passed in this check, by digest. */
  readonly rateableGirders: Set<string>;
  /** The digest of each girders row's record as the commit writes it (`girderRecordDigest`). */
  readonly recordDigests: Map<AnyConvertedRow, string>;
  /** Spans as the file leaves them, by span key, as `spanAsFileLeavesIt` works them out. */
  readonly spansAsLeft: Map<string, StoredSpan | null>;
}

/** A cell of the row's body at a column's place, as the problem list shows it. */
function valueAt(body: unknown, path: readonly string[]): ImportProblem['value'] {
  const value = path.reduce<unknown>((node, key) => (node as Record<string, unknown> | null | undefined)?.[key], body);
  if (Array.isArray(value)) return value.join(';');
  return typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean' ? value : null;
}

const findingProblem = (row: ConvertedRow<'findings'>, field: string, message: string): ImportProblem => {
  const column = findingColumnOf(row, field);
  return problemAt(row, column.header, column.path ? valueAt(row.body, column.path) : null, message);
};

/** Whether the file changes what a finding on the girder is checked against: the girder, its strand rows or its span. */
const touchedByFile = (row: ConvertedRow<'findings'>, inFile: FileFacts) => inFile.girders.has(girderKeyOf(row.body)) || inFile.strandRowIds.has(girderKeyOf(row.body)) || inFile.spans.has(spanKeyOf(row.body));

/**
 * The engine's judgement of each finding on a stored girder the file leaves as it is — strands the
 * girder lacks, a place beyond the span, a spall outside the concrete — by the rules that record
 * a finding through the API, each finding alone. A girder the file writes is judged so when the
 * commit has written it.
 */
async function misfitsOnStoredGirders(db: Db, rows: readonly AnyConvertedRow[], register: Register, inFile: FileFacts): Promise<Map<AnyConvertedRow, ImportProblem[]>> {
  const byGirder = new Map<number, ConvertedRow<'findings'>[]>();
  for (const row of rows) {
    if (row.template !== 'findings' || touchedByFile(row, inFile)) continue;
    const girder = register.girders.get(girderKeyOf(row.body));
    if (girder) addTo(byGirder, girder.id, row);
  }
  const misfits = new Map<AnyConvertedRow, ImportProblem[]>();
  for (const [girderId, findingRows] of byGirder) {
    const spanLengthM = register.spans.get(spanKeyOf(findingRows[0]!.body))!.length_m;
    const fields = await findingsMisfitOnGirder(db, girderId, spanLengthM, findingRows.map((row) => row.body.finding));
    findingRows.forEach((row, index) => misfits.set(row, fields[index]!.map((field) => findingProblem(row, field.field, field.message))));
  }
  return misfits;
}

/**
 * A finding row: its girder is in the register or the file; the strand row it names is the
 * girder's as the file leaves it; it fits the stored girder (`misfitsOnStoredGirders`); and its
 * inspection may take it (`placeOfImportedFindings`) — a new inspection, or the user's own draft,
 * where it adds a finding or changes the one of the same key.
 */
function judgeFinding(row: ConvertedRow<'findings'>, register: Register, user: SignedInUser, inFile: FileFacts, misfits: readonly ImportProblem[]): Judged {
  const { structureNumber, spanIndex, girderNumber, inspectedOn, finding } = row.body;
  const key = girderKeyOf(row.body);
  const stored = register.girders.get(key);
  if (!stored && !inFile.girders.has(key)) return refused(problemAt(row, row.keyColumns, `${structureNumber} span ${spanIndex} girder ${girderNumber}`, 'this girder is not in the register, and no valid girders row of this file adds it'));
  if (finding.strands && touchedByFile(row, inFile)) {
    const rowIds = inFile.strandRowIds.get(key) ?? (stored ? (register.strandRows.get(stored.id) ?? []).map((strandRow) => strandRow.row_key) : []);
    if (!rowIds.includes(finding.strands.rowId)) {
      return refused(findingProblem(row, 'strands.rowId', `girder ${girderNumber} of span ${spanIndex} has no strand row "${finding.strands.rowId}"${rowIds.length > 0 ? ` (its rows: ${rowIds.join(', ')})` : ''}`));
    }
  }
  if (misfits.length > 0) return refused(...misfits);
  const place = placeOfImportedFindings(register.inspections.get(structureNumber) ?? [], user, structureNumber, inspectedOn);
  switch (place.kind) {
    case 'refused':
      return refused(findingProblem(row, 'inspectedOn', place.message));
    case 'own-draft':
      return ok(stored ? importedFindingOutcomeInDraft(register.draftFindings.get(place.inspectionId) ?? [], stored.id, finding) : 'create');
    case 'new-inspection':
    case 'this-import':
      return ok('create');
  }
}

/** A prior-ratings row: its structure (and span) in the register or the file, approved already; it records a rating of that day, changes it, or finds it so. */
function judgePriorRating(row: ConvertedRow<'prior-ratings'>, register: Register, inFile: FileFacts): Judged {
  const { structureNumber, spanIndex, approvedOn } = row.body;
  const structure = register.structures.get(structureNumber);
  if (!structure && !inFile.structures.has(structureNumber)) return refused(problemAt(row, 'structure_number', structureNumber, 'is not in the register, and no valid structures row of this file adds it'));
  const span = spanIndex === null ? null : register.spans.get(spanKey({ structureNumber, spanIndex }));
  if (spanIndex !== null && !span && !inFile.spans.has(spanKey({ structureNumber, spanIndex }))) {
    return refused(problemAt(row, 'span_index', spanIndex, `structure ${structureNumber} has no span ${spanIndex} in the register or in this file`));
  }
  const misfit = priorRatingMisfit(row.body);
  if (misfit.length > 0) return refused(...misfit.map((field) => problemAt(row, priorRatingColumnOf(row, field.field), approvedOn, field.message)));
  // A span new in the file has no prior ratings yet.
  if (spanIndex !== null && !span) return ok('create');
  const sameDay = (register.priorRatings.get(structureNumber) ?? []).find((stored) => stored.approved_on === approvedOn && stored.span_id === (span?.id ?? null));
  if (!sameDay) return ok('create');
  const same = sameDay.lowest_legal_rf === row.body.lowestLegalRatingFactor && sameDay.design_inventory_rf === row.body.designInventoryRatingFactor && sameDay.source_note === row.body.sourceNote;
  return ok(same ? 'unchanged' : 'update');
}

/** The file's rows by what they key: strand rows by girder, structures and spans rows by number, and girders counted by span. */
function rowsByKey(rows: readonly AnyConvertedRow[]): Pick<FileFacts, 'strandRowIds' | 'strandRowRows' | 'structureRows' | 'spanRows' | 'girdersPerSpan'> {
  const strandRowRows = new Map<string, ConvertedRow<'strand-rows'>[]>();
  const structureRows = new Map<string, ConvertedRow<'structures'>>();
  const spanRows = new Map<string, ConvertedRow<'spans'>>();
  const girdersPerSpan = new Map<string, number>();
  for (const row of rows) {
    if (row.template === 'strand-rows') addTo(strandRowRows, girderKeyOf(row.body), row);
    else if (row.template === 'structures') structureRows.set(row.body.structureNumber, row);
    else if (row.template === 'spans') spanRows.set(spanKeyOf(row.body), row);
    else if (row.template === 'girders') girdersPerSpan.set(spanKeyOf(row.body), (girdersPerSpan.get(spanKeyOf(row.body)) ?? 0) + 1);
  }
  const strandRowIds = new Map([...strandRowRows].map(([key, ofGirder]) => [key, ofGirder.map((each) => each.body.strandRow.id)]));
  return { strandRowIds, strandRowRows, structureRows, spanRows, girdersPerSpan };
}

/**
 * Judges every converted row against the register: what it would create, change or leave as it
 * is, and what refuses it — a structure, span or girder it names that exists nowhere, a girder
 * type the catalogue lacks, a district the user may not change. Strand rows replace a girder's
 * rows as a whole, so they count once per girder.
 */
export async function judgeAgainstRegister(db: Db, user: SignedInUser, rows: readonly AnyConvertedRow[]): Promise<UploadJudgement> {
  const register = await readRegister(db, user, rows);
  const structuresInFile = new Map(rows.flatMap((row) => (row.template === 'structures' ? [[row.body.structureNumber, row.body.district] as const] : [])));
  const spansInFile = new Set(rows.flatMap((row) => (row.template === 'spans' ? [spanKeyOf(row.body)] : [])));
  const girdersInFile = new Set(rows.flatMap((row) => (row.template === 'girders' ? [girderKeyOf(row.body)] : [])));
  const inFile: FileFacts = { structures: new Set(structuresInFile.keys()), spans: spansInFile, girders: girdersInFile, ...rowsByKey(rows), rateableGirders: new Set(), recordDigests: new Map(), spansAsLeft: new Map() };
  const misfits = await misfitsOnStoredGirders(db, rows, register, inFile);
  const counts: Partial<Record<ImportTemplateName, { rows: number; create: number; update: number; unchanged: number }>> = {};
  const problems: ImportProblem[] = [];
  const strandRowsOfGirder = new Map<string, unknown[]>();

  for (const row of rows) {
    const count = (counts[row.template] ??= { rows: 0, create: 0, update: 0, unchanged: 0 });
    count.rows += 1;
    const district = districtOf(row, register, structuresInFile);
    if (district !== undefined && !canInDistrict(user, ACTION_OF[row.template], district)) {
      problems.push(problemAt(row, row.keyColumns, row.body.structureNumber, `you may not import ${row.template.replace('-', ' ')} in ${district}`));
      continue;
    }
    const judged = judgeRow(row, register, user, inFile, misfits.get(row) ?? []);
    problems.push(...judged.problems);
    if (judged.outcome === null) continue;
    if (row.template === 'strand-rows') {
      addTo(strandRowsOfGirder, girderKeyOf(row.body), row.body.strandRow);
      continue;
    }
    count[judged.outcome] += 1;
  }
  const strandCounts = counts['strand-rows'];
  for (const [key, strandRows] of strandRowsOfGirder) strandCounts![strandRowsOutcome(register, key, strandRows)] += 1;
  return { counts, problems, rows, rateableGirders: inFile.rateableGirders, girdersPerSpan: inFile.girdersPerSpan, recordDigests: inFile.recordDigests };
}

/** A girder's strand rows in the file against its stored ones: they replace them as a whole. */
function strandRowsOutcome(register: Register, key: string, strandRows: readonly unknown[]): Outcome {
  const stored = register.girders.get(key);
  if (!stored) return 'create';
  const storedRows = toGirderRecord(stored, register.strandRows.get(stored.id) ?? []).strandRows;
  return isDeepStrictEqual(storedRows, strandRows) ? 'unchanged' : 'update';
}

function judgeRow(row: AnyConvertedRow, register: Register, user: SignedInUser, inFile: FileFacts, misfits: readonly ImportProblem[]): Judged {
  switch (row.template) {
    case 'structures':
      return judgeStructure(row, register, user);
    case 'spans':
      return judgeSpan(row, register, inFile);
    case 'girders':
      return judgeGirder(row, register, inFile);
    case 'strand-rows':
      return judgeStrandRows(row, register, inFile);
    case 'findings':
      return judgeFinding(row, register, user, inFile, misfits);
    case 'prior-ratings':
      return judgePriorRating(row, register, inFile);
  }
}
