import {
  girderKey,
  spanKey,
  spanOfKey,
  type AnyConvertedRow,
  type ConvertedRow,
  type GirderRecord,
  type ImportProblem,
  type ImportTemplateName,
  type SignedInUser,
  type StrandRow,
} from '../../../shared/src';
import type { Transaction } from '../db/database';
import { inChunks } from '../db/many-created';
import { ROWS_PER_PAGE, type KeptRow } from './imports.repository';
import { toGirderRecord } from '../girders/girder-record';
import { findGirderById, findGirderNumbersOfSpans, findGirdersOfSpans, findGirderTypes, findStrandRows } from '../girders/girders.repository';
import { changeGirder, createGirder, createGirdersPageByPage, type GirdersPageWritten, type NewGirder } from '../girders/girders.service';
import { AppError } from '../http/app-error';
import { findSpansOfStructure, findSpansOfStructures, recountGirders } from '../spans/spans.repository';
import { changeSpan, createSpan, createSpans, type NewSpan, type NewSpanFields } from '../spans/spans.service';
import { findStructuresByNumbers } from '../structures/structures.repository';
import { changeStructure, createStructure, createStructures } from '../structures/structures.service';
import { writeFindingRow } from './import-write-findings';
import { writePriorRatingRow } from './import-write-prior-ratings';

/** Templates in the order their rows are written: each after what it hangs on. */
const WRITE_ORDER: readonly ImportTemplateName[] = ['structures', 'spans', 'girders', 'strand-rows', 'findings', 'prior-ratings'];

/** Called after each row is written, with how many are done and how many there are. */
export type CommitProgress = (done: number, total: number) => Promise<void> | void;

/** A service's refusal of one row (a rule, a right, a conflict), named at that row. */
function problemsOf(row: AnyConvertedRow, error: AppError): ImportProblem[] {
  const fields = (error.details as { fields?: { field: string; message: string }[] } | null)?.fields;
  if (fields && fields.length > 0) return fields.map((field) => ({ sheet: row.sheet, row: row.rowNumber, column: field.field, value: null, message: field.message }));
  return [{ sheet: row.sheet, row: row.rowNumber, column: row.keyColumns, value: null, message: error.message }];
}

/** Ids of what the file has written so far, by key, so later rows find the records earlier ones made. */
class WrittenRecords {
  readonly structures = new Map<string, number>();
  readonly spans = new Map<string, number>();
  readonly girders = new Map<string, number>();
}

/**
 * The checked rows as the commit reads them: a template's rows a page at a time, in file order,
 * so the whole file is never held at once; and what the check kept for the commit.
 */
export interface CheckedRows {
  readonly total: number;
  rowCountOf(template: ImportTemplateName): number;
  pagesOf(template: ImportTemplateName): AsyncIterable<readonly KeptRow[]>;
  /** Digests of the girders the engine passed in the check (`girderRatingProblems`). */
  readonly rateableGirders: ReadonlySet<string>;
  /** How many girders the file gives each span, by span key; null when the check did not keep it, and the commit counts them. */
  readonly girdersPerSpan: ReadonlyMap<string, number> | null;
}

async function countGirdersPerSpan(checked: CheckedRows): Promise<ReadonlyMap<string, number>> {
  const girdersPerSpan = new Map<string, number>();
  for await (const page of checked.pagesOf('girders')) {
    for (const row of page as readonly ConvertedRow<'girders'>[]) girdersPerSpan.set(spanKey(row.body), (girdersPerSpan.get(spanKey(row.body)) ?? 0) + 1);
  }
  return girdersPerSpan;
}

/** What the commit needs to know of the file as a whole: how many girders each new span gets, and each girder's strand rows. */
async function fileFacts(checked: CheckedRows) {
  const girdersPerSpan = checked.girdersPerSpan ?? (await countGirdersPerSpan(checked));
  const strandRowsOfGirder = new Map<string, StrandRow[]>();
  for await (const page of checked.pagesOf('strand-rows')) {
    for (const row of page as readonly ConvertedRow<'strand-rows'>[]) {
      const key = girderKey(row.body);
      const known = strandRowsOfGirder.get(key);
      if (known) known.push(row.body.strandRow);
      else strandRowsOfGirder.set(key, [row.body.strandRow]);
    }
  }
  return { girdersPerSpan, strandRowsOfGirder };
}

type Facts = Awaited<ReturnType<typeof fileFacts>>;

interface Writer {
  readonly trx: Transaction;
  readonly user: SignedInUser;
  readonly written: WrittenRecords;
  readonly facts: Facts;
  readonly girderTypeIds: ReadonlyMap<string, number>;
  /** Spans that girders were added to: their girder count is set once all are written. */
  readonly spansGainingGirders: Set<number>;
  /** Girders the engine has passed, by digest: in the import's check, then in this commit. */
  readonly rateableGirders: Set<string>;
}

async function structureId(writer: Writer, structureNumber: string): Promise<number> {
  const known = writer.written.structures.get(structureNumber);
  if (known !== undefined) return known;
  const [stored] = await findStructuresByNumbers(writer.trx, [structureNumber]);
  if (!stored) throw AppError.invalidFields([{ field: 'structure_number', message: `structure ${structureNumber} is not in the register` }]);
  writer.written.structures.set(structureNumber, stored.id);
  return stored.id;
}

async function spanId(writer: Writer, structureNumber: string, spanIndex: number): Promise<number> {
  const key = spanKey({ structureNumber, spanIndex });
  const known = writer.written.spans.get(key);
  if (known !== undefined) return known;
  const span = (await findSpansOfStructure(writer.trx, await structureId(writer, structureNumber))).find((each) => each.span_index === spanIndex);
  if (!span) throw AppError.invalidFields([{ field: 'span_index', message: `structure ${structureNumber} has no span ${spanIndex}` }]);
  writer.written.spans.set(key, span.id);
  return span.id;
}

async function storedGirder(writer: Writer, key: Parameters<typeof girderKey>[0]) {
  const id = writer.written.girders.get(girderKey(key));
  if (id !== undefined) return findGirderById(writer.trx, id);
  const [girder] = (await findGirdersOfSpans(writer.trx, [await spanId(writer, key.structureNumber, key.spanIndex)])).filter((each) => each.girder_number === key.girderNumber);
  return girder;
}

async function writeStructure(writer: Writer, row: ConvertedRow<'structures'>): Promise<void> {
  const [stored] = await findStructuresByNumbers(writer.trx, [row.body.structureNumber]);
  const detail = stored
    ? await changeStructure({ db: writer.trx, user: writer.user }, stored.id, { ...row.body, version: stored.version })
    : await createStructure({ db: writer.trx, user: writer.user }, row.body);
  writer.written.structures.set(row.body.structureNumber, detail.id);
}

/** What a new span has when its row leaves it out: the optional columns of the spans template, and diaphragms, which it does not carry. */
const NEW_SPAN_DEFAULTS: Pick<NewSpanFields, 'barrierFaceToGirderMm' | 'haunchMm' | 'wearingSurface' | 'barriers' | 'diaphragms'> = {
  barrierFaceToGirderMm: null,
  // The database's own default for a span without a haunch, given here so the check rates new spans' girders on what the commit writes.
  haunchMm: 0,
  wearingSurface: null,
  barriers: [],
  diaphragms: [],
};

async function writeSpan(writer: Writer, row: ConvertedRow<'spans'>): Promise<void> {
  const { structureNumber, spanIndex, span } = row.body;
  const id = await structureId(writer, structureNumber);
  const stored = (await findSpansOfStructure(writer.trx, id)).find((each) => each.span_index === spanIndex);
  if (stored) {
    await changeSpan({ db: writer.trx, user: writer.user }, stored.id, { ...span, version: stored.version });
    writer.written.spans.set(spanKey(row.body), stored.id);
    return;
  }
  const created = await createSpan({ db: writer.trx, user: writer.user }, id, spanIndex, newSpanFields(row), girdersOfNewSpan(writer, row));
  writer.written.spans.set(spanKey(row.body), created.id);
}

/** A new span's fields: the row's, and the defaults of those it leaves out. */
export function newSpanFields(row: ConvertedRow<'spans'>): NewSpanFields {
  return { ...NEW_SPAN_DEFAULTS, ...row.body.span } as NewSpanFields;
}

/** How many girders a new span gets: those of the same file, at least two. */
function girdersOfNewSpan(writer: Writer, row: ConvertedRow<'spans'>): number {
  const girderCount = writer.facts.girdersPerSpan.get(spanKey(row.body)) ?? 0;
  if (girderCount < 2) throw AppError.invalidFields([{ field: row.keyColumns, message: 'a new span needs its girders (at least two) in the same file' }]);
  return girderCount;
}

function recordOf(writer: Writer, row: ConvertedRow<'girders'>, strandRows: GirderRecord['strandRows']): GirderRecord {
  const { girderTypeName, record } = row.body;
  const girderTypeId = girderTypeName === null ? null : (writer.girderTypeIds.get(girderTypeName.toLowerCase()) ?? null);
  if (girderTypeName !== null && girderTypeId === null) throw AppError.invalidFields([{ field: 'girder_type', message: `"${girderTypeName}" is not a girder type of the catalogue` }]);
  return { ...record, girderTypeId, strandRows };
}

async function writeGirder(writer: Writer, row: ConvertedRow<'girders'>): Promise<void> {
  const key = girderKey(row.body);
  const stored = await storedGirder(writer, row.body);
  const fileStrandRows = writer.facts.strandRowsOfGirder.get(key);
  if (stored) {
    const strandRows = fileStrandRows ?? toGirderRecord(stored, await findStrandRows(writer.trx, stored.id)).strandRows;
    await changeGirder({ db: writer.trx, user: writer.user }, stored.id, { ...recordOf(writer, row, strandRows), version: stored.version });
    writer.written.girders.set(key, stored.id);
    return;
  }
  const spanRowId = await spanId(writer, row.body.structureNumber, row.body.spanIndex);
  const created = await createGirder({ db: writer.trx, user: writer.user }, spanRowId, row.body.girderNumber, recordOf(writer, row, fileStrandRows ?? []));
  writer.spansGainingGirders.add(spanRowId);
  writer.written.girders.set(key, created.id);
}

/** Strand rows of a girder the file does not otherwise change replace its stored rows as a whole, once per girder. */
async function writeStrandRows(writer: Writer, row: ConvertedRow<'strand-rows'>, done: Set<string>): Promise<void> {
  const key = girderKey(row.body);
  if (done.has(key) || writer.written.girders.has(key)) return;
  done.add(key);
  const stored = await storedGirder(writer, row.body);
  if (!stored) throw AppError.invalidFields([{ field: row.keyColumns, message: 'this girder is neither in the register nor in this file' }]);
  const record = toGirderRecord(stored, await findStrandRows(writer.trx, stored.id));
  await changeGirder({ db: writer.trx, user: writer.user }, stored.id, { ...record, strandRows: writer.facts.strandRowsOfGirder.get(key)!, version: stored.version });
}

/**
 * New records are written many at a time: a file of tens of thousands of girders would take
 * minutes row by row. Each batch goes through the services' own `create…s`, on the same rules
 * as one record through the API. A batch is a whole stored page. Girders, by far the most rows
 * of an inventory file, go page after page without a pause (`writeGirderRows`).
 */
const ROWS_PER_BATCH = ROWS_PER_PAGE;

/** A template's rows, split into those new to the register (written in batches here) and those to write one by one (changes). */
type NewRowsWriter = (writer: Writer, rows: readonly AnyConvertedRow[], refuse: Refuse) => Promise<AnyConvertedRow[]>;

/** Names a row a service refused among the commit's problems. */
type Refuse = (row: AnyConvertedRow, error: AppError) => void;

async function writeNewStructures(writer: Writer, rows: readonly AnyConvertedRow[], refuse: Refuse): Promise<AnyConvertedRow[]> {
  const structureRows = rows as readonly ConvertedRow<'structures'>[];
  const stored = new Set((await findStructuresByNumbers(writer.trx, structureRows.map((row) => row.body.structureNumber))).map((row) => row.structure_number));
  const fresh = structureRows.filter((row) => !stored.has(row.body.structureNumber));
  const created = await createStructures({ db: writer.trx, user: writer.user }, fresh.map((row) => row.body));
  fresh.forEach((row, index) => {
    const id = created.ids[index];
    if (id) writer.written.structures.set(row.body.structureNumber, id);
    else refuse(row, created.refused.get(index)!);
  });
  return structureRows.filter((row) => stored.has(row.body.structureNumber));
}

/** Register ids of the structures these rows name (written by the file or already stored); a row naming an unknown one is refused. */
async function knownStructureIds(writer: Writer, structureNumbers: readonly string[]): Promise<void> {
  const unknown = [...new Set(structureNumbers)].filter((number) => !writer.written.structures.has(number));
  for (const row of await findStructuresByNumbers(writer.trx, unknown)) writer.written.structures.set(row.structure_number, row.id);
}

async function writeNewSpans(writer: Writer, rows: readonly AnyConvertedRow[], refuse: Refuse): Promise<AnyConvertedRow[]> {
  const spanRows = rows as readonly ConvertedRow<'spans'>[];
  await knownStructureIds(writer, spanRows.map((row) => row.body.structureNumber));
  const structureIds = [...new Set(spanRows.flatMap((row) => writer.written.structures.get(row.body.structureNumber) ?? []))];
  const storedSpans = new Set((await findSpansOfStructures(writer.trx, structureIds)).map((span) => `${span.structure_id}/${span.span_index}`));
  const isStored = (row: ConvertedRow<'spans'>) => storedSpans.has(`${writer.written.structures.get(row.body.structureNumber)}/${row.body.spanIndex}`);
  const fresh: { row: ConvertedRow<'spans'>; span: NewSpan }[] = [];
  for (const row of spanRows) {
    if (isStored(row)) continue;
    try {
      const structureRowId = writer.written.structures.get(row.body.structureNumber);
      if (structureRowId === undefined) throw AppError.invalidFields([{ field: 'structure_number', message: `structure ${row.body.structureNumber} is not in the register` }]);
      fresh.push({ row, span: { structureId: structureRowId, spanIndex: row.body.spanIndex, fields: newSpanFields(row), girderCount: girdersOfNewSpan(writer, row) } });
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      refuse(row, error);
    }
  }
  const created = await createSpans({ db: writer.trx, user: writer.user }, fresh.map((each) => each.span));
  fresh.forEach(({ row }, index) => {
    const id = created.ids[index];
    if (id) writer.written.spans.set(spanKey(row.body), id);
    else refuse(row, created.refused.get(index)!);
  });
  return spanRows.filter(isStored);
}

/** The spans the file's girders rows are on (written by the file or already stored), by register id; each is known to the writer by its key. */
async function spansOfFileGirders(writer: Writer): Promise<number[]> {
  const keys = [...writer.facts.girdersPerSpan.keys()];
  await knownSpanIds(writer, keys.map(spanOfKey));
  return [...new Set(keys.flatMap((key) => writer.written.spans.get(key) ?? []))];
}

/** A girders row as its page keeps it, with its record's digest when the check worked one out. */
type KeptGirderRow = ConvertedRow<'girders'> & { readonly recordDigest?: string };

/** A page of girders rows as the girders new to the register they add; a row refused here is named, one of a stored girder left for `writeGirder`. */
function newGirdersOf(writer: Writer, page: readonly KeptGirderRow[], isStored: (row: ConvertedRow<'girders'>) => boolean, refuse: Refuse) {
  const rows: ConvertedRow<'girders'>[] = [];
  const girders: NewGirder[] = [];
  for (const row of page) {
    if (isStored(row)) continue;
    try {
      const spanRowId = writer.written.spans.get(spanKey(row.body));
      if (spanRowId === undefined) throw AppError.invalidFields([{ field: 'span_index', message: `structure ${row.body.structureNumber} has no span ${row.body.spanIndex}` }]);
      const record = recordOf(writer, row, writer.facts.strandRowsOfGirder.get(girderKey(row.body)) ?? []);
      girders.push({ spanId: spanRowId, girderNumber: row.body.girderNumber, record, recordDigest: row.recordDigest });
      rows.push(row);
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      refuse(row, error);
    }
  }
  return { rows, girders };
}

/**
 * The girders rows. Girders new to the register go page by page through the service's
 * `createGirdersPageByPage`, which checks a page while the database writes the one before: which
 * girders are stored already is read once beforehand, and the pages come from another
 * connection, so nothing waits on this transaction between pages. A file's keys are unique, so
 * no page adds a girder another page names. Rows of girders already stored are changed one by
 * one afterwards, in a second reading of the pages.
 */
async function writeGirderRows(writer: Writer, checked: CheckedRows, refuse: Refuse, pageSent: (rows: number) => Promise<void>): Promise<void> {
  const spanIds = await spansOfFileGirders(writer);
  const stored = new Set((await findGirderNumbersOfSpans(writer.trx, spanIds)).map((girder) => `${girder.span_id}/${girder.girder_number}`));
  const isStored = (row: ConvertedRow<'girders'>) => stored.has(`${writer.written.spans.get(spanKey(row.body))}/${row.body.girderNumber}`);
  const rowsOfPage = new Map<readonly NewGirder[], readonly ConvertedRow<'girders'>[]>();
  let changesToWrite = false;
  async function* newGirderPages() {
    for await (const page of checked.pagesOf('girders') as AsyncIterable<readonly KeptGirderRow[]>) {
      const fresh = newGirdersOf(writer, page, isStored, refuse);
      changesToWrite ||= fresh.rows.length < page.length;
      rowsOfPage.set(fresh.girders, fresh.rows);
      yield fresh.girders;
      await pageSent(page.length);
    }
  }
  const onWritten: GirdersPageWritten = (girders, created) => {
    const rows = rowsOfPage.get(girders)!;
    rowsOfPage.delete(girders);
    rows.forEach((row, index) => {
      const id = created.ids[index];
      if (!id) return refuse(row, created.refused.get(index)!);
      writer.written.girders.set(girderKey(row.body), id);
      writer.spansGainingGirders.add(girders[index]!.spanId);
    });
  };
  await createGirdersPageByPage({ db: writer.trx, user: writer.user }, spanIds, newGirderPages(), { rateableGirders: writer.rateableGirders, onWritten });
  if (!changesToWrite) return;
  for await (const page of checked.pagesOf('girders') as AsyncIterable<readonly ConvertedRow<'girders'>[]>) {
    for (const row of page) if (isStored(row)) await writeOneByOne(writer, row, new Set(), refuse);
  }
}

/** Register ids of the spans these keys name (written by the file or already stored). */
async function knownSpanIds(writer: Writer, keys: readonly { structureNumber: string; spanIndex: number }[]): Promise<void> {
  await knownStructureIds(writer, keys.map((key) => key.structureNumber));
  const unknownStructures = [...new Set(keys.filter((key) => !writer.written.spans.has(spanKey(key))).flatMap((key) => writer.written.structures.get(key.structureNumber) ?? []))];
  const numberOf = new Map([...writer.written.structures].map(([number, id]) => [id, number]));
  for (const span of await findSpansOfStructures(writer.trx, unknownStructures)) {
    writer.written.spans.set(spanKey({ structureNumber: numberOf.get(span.structure_id)!, spanIndex: span.span_index }), span.id);
  }
}

const NEW_ROWS_WRITERS: Partial<Record<ImportTemplateName, NewRowsWriter>> = {
  structures: writeNewStructures,
  spans: writeNewSpans,
};

/**
 * Writes the checked rows through the same services as the API, so every rule, right and
 * history entry applies, inside the caller's transaction: records new to the register in
 * batches, changes one by one. A row a service refuses becomes a problem at that row; the
 * caller rolls everything back when there is any.
 */
export async function writeRows(trx: Transaction, user: SignedInUser, checked: CheckedRows, onProgress: CommitProgress): Promise<ImportProblem[]> {
  const writer: Writer = {
    trx,
    user,
    written: new WrittenRecords(),
    facts: await fileFacts(checked),
    girderTypeIds: new Map((await findGirderTypes(trx)).map((type) => [type.name.toLowerCase(), type.id])),
    spansGainingGirders: new Set(),
    rateableGirders: new Set(checked.rateableGirders),
  };
  const problems: ImportProblem[] = [];
  const refuse: Refuse = (row, error) => problems.push(...problemsOf(row, error));
  const strandRowsDone = new Set<string>();
  let done = 0;
  const progressed = async (rows: number) => {
    done += rows;
    await onProgress(done, checked.total);
  };
  for (const template of WRITE_ORDER) {
    if (template === 'girders') {
      await writeGirderRows(writer, checked, refuse, progressed);
      continue;
    }
    if (template === 'strand-rows' && allWrittenWithTheirGirders(writer)) {
      await progressed(checked.rowCountOf(template));
      continue;
    }
    for await (const page of checked.pagesOf(template)) {
      for (const batch of inChunks(page, ROWS_PER_BATCH)) {
        const oneByOne = (await NEW_ROWS_WRITERS[template]?.(writer, batch, refuse)) ?? batch;
        for (const row of oneByOne) await writeOneByOne(writer, row, strandRowsDone, refuse);
        await progressed(batch.length);
      }
    }
  }
  if (problems.length === 0) await recountGirders(trx, [...writer.spansGainingGirders]);
  return problems;
}

/** Whether every girder the strand rows belong to was written by the girders rows, with them: reading the strand-rows pages again would find nothing to do. */
const allWrittenWithTheirGirders = (writer: Writer) => [...writer.facts.strandRowsOfGirder.keys()].every((key) => writer.written.girders.has(key));

/** A row written on its own (a change to what is stored), or named among the problems when a service refuses it. */
async function writeOneByOne(writer: Writer, row: AnyConvertedRow, strandRowsDone: Set<string>, refuse: Refuse): Promise<void> {
  try {
    await writeRow(writer, row, strandRowsDone);
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    refuse(row, error);
  }
}

async function writeRow(writer: Writer, row: AnyConvertedRow, strandRowsDone: Set<string>): Promise<void> {
  switch (row.template) {
    case 'structures':
      return writeStructure(writer, row);
    case 'spans':
      return writeSpan(writer, row);
    case 'girders':
      return writeGirder(writer, row);
    case 'strand-rows':
      return writeStrandRows(writer, row, strandRowsDone);
    case 'findings':
      return writeFindingRow(writer.trx, writer.user, row);
    case 'prior-ratings':
      return writePriorRatingRow(writer.trx, writer.user, row);
  }
}
