import { isDeepStrictEqual } from 'node:util';
import {
  IMPORT_TEMPLATE_NAMES,
  canInDistrict,
  checkUpload,
  convertRow,
  girderKey,
  readHeaders,
  spanKey,
  type Action,
  type AnyConvertedRow,
  type ConvertedRow,
  type HeaderReading,
  type ImportCounts,
  type ImportProblem,
  type ImportTemplateName,
  type SignedInUser,
} from '../../../shared/src';
import type { Database, Transaction } from '../db/database';
import { toGirderRecord } from '../girders/girder-record';
import { findGirdersOfSpans, findGirderTypes, findStrandRowsOfGirders, type GirderRow } from '../girders/girders.repository';
import { findSpansOfStructures, type SpanRow } from '../spans/spans.repository';
import { editableFields as spanFields } from '../spans/spans.service';
import { findStructuresByNumbers, type StructureRow } from '../structures/structures.repository';
import { editableFields as structureFields } from '../structures/structures.service';
import { readRows } from './readers/read-rows';

type Db = Database | Transaction;

/** What an upload would do, and every problem that stops it. Nothing is written while checking. */
export interface UploadJudgement {
  readonly counts: Partial<Record<ImportTemplateName, ImportCounts>>;
  readonly problems: ImportProblem[];
  readonly rows: readonly AnyConvertedRow[];
}

/** Who may import each template (product.md, permission matrix): inventory by its editors, findings by inspectors and raters. */
const ACTION_OF: Readonly<Record<ImportTemplateName, Action>> = {
  structures: 'editInventory',
  spans: 'editInventory',
  girders: 'editInventory',
  'strand-rows': 'editInventory',
  findings: 'importFindings',
  'prior-ratings': 'runRatings',
};

/** The template a sheet or file name stands for ("Strand rows", "strand_rows", "strand-rows"), if any. */
export function templateNamed(text: string): ImportTemplateName | null {
  const name = text.trim().toLowerCase().replace(/[ _]+/g, '-');
  return IMPORT_TEMPLATE_NAMES.find((template) => template === name) ?? null;
}

/**
 * Reads every row of the file and checks it against its template (a sheet is named after its
 * template; a CSV file holds the template given), then the rows against each other. Problems
 * are collected rather than thrown, so the person sees all of them at once.
 */
export async function readAndConvert(filePath: string, csvTemplate: ImportTemplateName | null): Promise<{ rows: AnyConvertedRow[]; problems: ImportProblem[] }> {
  const rows: AnyConvertedRow[] = [];
  const problems: ImportProblem[] = [];
  const headersBySheet = new Map<string, { template: ImportTemplateName; headers: HeaderReading } | null>();
  for await (const row of readRows(filePath, csvTemplate ? { sheetName: csvTemplate } : {})) {
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
    const converted = convertRow(sheet.template, sheet.headers, row);
    if (converted.ok) rows.push(converted.row as AnyConvertedRow);
    else problems.push(...converted.problems);
  }
  const acrossRows = checkUpload(rows);
  problems.push(...acrossRows.problems);
  return { rows, problems };
}

const problemAt = (row: AnyConvertedRow, column: string, value: ImportProblem['value'], message: string): ImportProblem => ({ sheet: row.sheet, row: row.rowNumber, column, value, message });

/** The register as the upload touches it, read in a few queries. */
interface Register {
  readonly structures: ReadonlyMap<string, StructureRow>;
  readonly spans: ReadonlyMap<string, SpanRow>;
  readonly girders: ReadonlyMap<string, GirderRow>;
  readonly strandRows: ReadonlyMap<number, Parameters<typeof toGirderRecord>[1]>;
  readonly girderTypeIds: ReadonlyMap<string, number>;
}

async function readRegister(db: Db, rows: readonly AnyConvertedRow[]): Promise<Register> {
  const numbers = [...new Set(rows.map((row) => row.body.structureNumber))];
  const structureRows = await findStructuresByNumbers(db, numbers);
  const structures = new Map(structureRows.map((row) => [row.structure_number, row]));
  const numberOf = new Map(structureRows.map((row) => [row.id, row.structure_number]));
  const spanRows = await findSpansOfStructures(db, structureRows.map((row) => row.id));
  const spans = new Map(spanRows.map((row) => [spanKey({ structureNumber: numberOf.get(row.structure_id)!, spanIndex: row.span_index }), row]));
  const girderRows = await findGirdersOfSpans(db, spanRows.map((row) => row.id));
  const girders = new Map(girderRows.map((row) => [girderKey({ structureNumber: row.structure_number, spanIndex: row.span_index, girderNumber: row.girder_number }), row]));
  const strandRows = await findStrandRowsOfGirders(db, girderRows.map((row) => row.id));
  const girderTypeIds = new Map((await findGirderTypes(db)).map((type) => [type.name.toLowerCase(), type.id]));
  return { structures, spans, girders, strandRows, girderTypeIds };
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

function judgeSpan(row: ConvertedRow<'spans'>, register: Register, inFile: ReadonlySet<string>): Judged {
  const stored = register.spans.get(spanKey(row.body));
  if (stored) return ok(sameAs(spanFields(stored), row.body.span) ? 'unchanged' : 'update');
  if (!register.structures.has(row.body.structureNumber) && !inFile.has(row.body.structureNumber)) {
    return refused(problemAt(row, row.keyColumns, row.body.structureNumber, `structure ${row.body.structureNumber} is neither in the register nor in this file`));
  }
  return ok('create');
}

function judgeGirder(row: ConvertedRow<'girders'>, register: Register, spansInFile: ReadonlySet<string>): Judged {
  const { girderTypeName } = row.body;
  const girderTypeId = girderTypeName === null ? null : register.girderTypeIds.get(girderTypeName.toLowerCase());
  if (girderTypeId === undefined) return refused(problemAt(row, 'girder_type', girderTypeName, 'is not a girder type of the catalogue; add it there first, or give the section'));
  const stored = register.girders.get(girderKey(row.body));
  if (stored) {
    const { strandRows: _strandRows, ...storedRecord } = toGirderRecord(stored, register.strandRows.get(stored.id) ?? []);
    return ok(sameAs(storedRecord, { ...row.body.record, girderTypeId }) ? 'unchanged' : 'update');
  }
  if (!register.spans.has(spanKey(row.body)) && !spansInFile.has(spanKey(row.body))) {
    return refused(problemAt(row, row.keyColumns, `${row.body.structureNumber} span ${row.body.spanIndex}`, 'this span is neither in the register nor in this file'));
  }
  return ok('create');
}

function judgeOnGirder(row: ConvertedRow<'strand-rows'> | ConvertedRow<'findings'>, register: Register, girdersInFile: ReadonlySet<string>): Judged {
  if (register.girders.has(girderKey(row.body)) || girdersInFile.has(girderKey(row.body))) return ok('create');
  const { structureNumber, spanIndex, girderNumber } = row.body;
  return refused(problemAt(row, row.keyColumns, `${structureNumber} span ${spanIndex} girder ${girderNumber}`, 'this girder is neither in the register nor in this file'));
}

function judgePriorRating(row: ConvertedRow<'prior-ratings'>, register: Register): Judged {
  const { structureNumber, spanIndex } = row.body;
  if (!register.structures.has(structureNumber)) return refused(problemAt(row, 'structure_number', structureNumber, 'is not in the register'));
  if (spanIndex !== null && !register.spans.has(spanKey({ structureNumber, spanIndex }))) return refused(problemAt(row, 'span_index', spanIndex, `structure ${structureNumber} has no span ${spanIndex}`));
  return ok('create');
}

/**
 * Judges every converted row against the register: what it would create, change or leave as it
 * is, and what refuses it — a structure, span or girder it names that exists nowhere, a girder
 * type the catalogue lacks, a district the user may not change. Strand rows replace a girder's
 * rows as a whole, so they count once per girder.
 */
export async function judgeAgainstRegister(db: Db, user: SignedInUser, rows: readonly AnyConvertedRow[]): Promise<UploadJudgement> {
  const register = await readRegister(db, rows);
  const structuresInFile = new Map(rows.flatMap((row) => (row.template === 'structures' ? [[row.body.structureNumber, row.body.district] as const] : [])));
  const spansInFile = new Set(rows.flatMap((row) => (row.template === 'spans' ? [spanKey(row.body)] : [])));
  const girdersInFile = new Set(rows.flatMap((row) => (row.template === 'girders' ? [girderKey(row.body)] : [])));
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
    const judged = judgeRow(row, register, user, { structures: new Set(structuresInFile.keys()), spans: spansInFile, girders: girdersInFile });
    problems.push(...judged.problems);
    if (judged.outcome === null) continue;
    if (row.template === 'strand-rows') {
      strandRowsOfGirder.set(girderKey(row.body), [...(strandRowsOfGirder.get(girderKey(row.body)) ?? []), row.body.strandRow]);
      continue;
    }
    count[judged.outcome] += 1;
  }
  const strandCounts = counts['strand-rows'];
  for (const [key, strandRows] of strandRowsOfGirder) strandCounts![strandRowsOutcome(register, key, strandRows)] += 1;
  return { counts, problems, rows };
}

/** A girder's strand rows in the file against its stored ones: they replace them as a whole. */
function strandRowsOutcome(register: Register, key: string, strandRows: readonly unknown[]): Outcome {
  const stored = register.girders.get(key);
  if (!stored) return 'create';
  const storedRows = toGirderRecord(stored, register.strandRows.get(stored.id) ?? []).strandRows;
  return isDeepStrictEqual(storedRows, strandRows) ? 'unchanged' : 'update';
}

function judgeRow(row: AnyConvertedRow, register: Register, user: SignedInUser, inFile: { structures: ReadonlySet<string>; spans: ReadonlySet<string>; girders: ReadonlySet<string> }): Judged {
  switch (row.template) {
    case 'structures':
      return judgeStructure(row, register, user);
    case 'spans':
      return judgeSpan(row, register, inFile.structures);
    case 'girders':
      return judgeGirder(row, register, inFile.spans);
    case 'strand-rows':
    case 'findings':
      return judgeOnGirder(row, register, inFile.girders);
    case 'prior-ratings':
      return judgePriorRating(row, register);
  }
}
