import { hash } from 'node:crypto';
import { ENGINE_VERSION, LIBRARY_VEHICLE_IDS, parseRateFile, type CalcFileIssue, type DamageEntry, type GirderTypeChange, type NewGirderType, type GirderChange, type GirderDetail, type GirderRecord, type GirderSummary, type GirderTypeSummary, type SignedInUser } from '../../../shared/src';
import { recordAuditEvent, recordAuditEvents } from '../audit/audit-events';
import { changedFields } from '../audit/changed-fields';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { onlyCreatedId, type ManyCreated } from '../db/many-created';
import { WritesInFlight } from '../db/writes-in-flight';
import { markSpansReratingDue } from '../ratings/ratings.repository';
import { AppError, type InvalidField } from '../http/app-error';
import { findSpanById, findSpansWithPlace, type SpanRow } from '../spans/spans.repository';
import { findStructureById } from '../structures/structures.repository';
import { assertMayEditIn } from '../structures/structures.service';
import { girderCalcFileParts, STORED_SPAN_FIELDS, type StoredGirder, type StoredSpan } from './girder-calc-file';
import { girderColumnsOf, recordPathOf, toGirderRecord } from './girder-record';
import {
  findDistrictsUsingGirderType,
  findGirderById,
  findGirderTypeById,
  findGirderTypes,
  findGirdersOfSpan,
  findStrandRows,
  girderTypeNameTaken,
  insertGirders,
  insertGirderType,
  updateGirder,
  updateGirderType,
  type GirderInsert,
  type GirderRow,
  type GirderTypeRow,
  type StrandRowRecord,
} from './girders.repository';

/** The girders of a span across it, with their strand counts. */
export async function listGirdersOfSpan({ db }: { db: Database }, spanId: number): Promise<GirderSummary[]> {
  if (!(await findSpanById(db, spanId))) throw AppError.notFound(`There is no span with id ${spanId}`);
  return (await findGirdersOfSpan(db, spanId)).map((row) => ({
    id: row.id,
    spanId: row.span_id,
    girderNumber: row.girder_number,
    position: row.position,
    girderTypeName: row.girder_type_name,
    strandRowCount: Number(row.strand_row_count),
    strandCount: Number(row.strand_count ?? 0),
    harped: row.harped,
    debonded: row.debonded,
    concreteStrengthMpa: row.concrete_strength_mpa,
    tensioning: row.tensioning,
    version: row.version,
  }));
}

function toGirderTypeSummary(row: GirderTypeRow): GirderTypeSummary {
  return {
    id: row.id,
    name: row.name,
    shape: row.section.shape,
    depthMm: row.section.depthMm ?? null,
    source: row.source,
    section: row.section,
    girderCount: Number(row.girder_count),
    version: row.version,
  };
}

/** The catalogue of girder shapes, by name; a girder refers to one and may override some of its dimensions. */
export async function listGirderTypes({ db }: { db: Database }): Promise<GirderTypeSummary[]> {
  return (await findGirderTypes(db)).map(toGirderTypeSummary);
}

async function assertTypeNameFree(db: Database | Transaction, name: string, exceptId?: number): Promise<void> {
  if (await girderTypeNameTaken(db, name, exceptId)) throw AppError.alreadyExists(`The catalogue already has a girder type named "${name}"`, 'name');
}

/** Adds a shape to the catalogue; it is network-wide, and no girder uses it yet. */
export async function createGirderType({ db, user }: { db: Database; user: SignedInUser }, type: NewGirderType): Promise<GirderTypeSummary> {
  return withTransaction(db, async (trx) => {
    await assertTypeNameFree(trx, type.name);
    const id = await insertGirderType(trx, type, user.id);
    await recordAuditEvent({ db: trx, user, action: 'girder-type.created', entity: { type: 'girder-type', id }, after: type });
    return toGirderTypeSummary((await findGirderTypeById(trx, id))!);
  });
}

/**
 * Changes a catalogue type. Its section is every using girder's section, so a new section needs
 * the right to change each district whose girders use it, keeps the shape those girders'
 * overrides refer to, and is refused when the overrides name a dimension it no longer has.
 */
export async function changeGirderType({ db, user }: { db: Database; user: SignedInUser }, id: number, { version, ...fields }: GirderTypeChange): Promise<GirderTypeSummary> {
  return withTransaction(db, async (trx) => {
    const row = await findGirderTypeById(trx, id, { forUpdate: true });
    if (!row) throw AppError.notFound(`There is no girder type with id ${id}`);
    if (row.version !== version) throw AppError.versionConflict(`Girder type ${row.name}`, toGirderTypeSummary(row));
    const changes = changedFields({ name: row.name, section: row.section, source: row.source }, fields);
    if (changes.fields.length === 0) return toGirderTypeSummary(row);
    if (fields.name !== undefined) await assertTypeNameFree(trx, fields.name, id);
    if (changes.fields.includes('section') && Number(row.girder_count) > 0) {
      for (const district of await findDistrictsUsingGirderType(trx, id)) assertMayEditIn(user, district);
      if (fields.section!.shape !== row.section.shape) {
        throw AppError.invalidFields([{ field: 'section.shape', message: `${row.girder_count} girders use this type as a ${row.section.shape}; add a new type for the new shape` }]);
      }
    }
    if (!(await updateGirderType(trx, id, version, fields, user.id))) throw AppError.versionConflict(`Girder type ${row.name}`, toGirderTypeSummary(row));
    await recordAuditEvent({ db: trx, user, action: 'girder-type.changed', entity: { type: 'girder-type', id }, before: changes.before, after: changes.after });
    return toGirderTypeSummary((await findGirderTypeById(trx, id))!);
  });
}

function toGirderDetail(row: GirderRow, strandRows: readonly StrandRowRecord[]): GirderDetail {
  return {
    ...toGirderRecord(row, strandRows),
    id: row.id,
    spanId: row.span_id,
    spanIndex: row.span_index,
    structureId: row.structure_id,
    structureNumber: row.structure_number,
    district: row.district,
    girderNumber: row.girder_number,
    girderTypeName: row.girder_type_name,
    section: row.section ?? { ...row.type_section, ...row.section_overrides },
    version: row.version,
    updated: { at: row.updated_at.toISOString(), by: row.updated_by_name },
  };
}

const girderNotFound = (id: number) => AppError.notFound(`There is no girder with id ${id}`);

export async function getGirder({ db }: { db: Database }, id: number): Promise<GirderDetail> {
  const row = await findGirderById(db, id);
  if (!row) throw girderNotFound(id);
  return toGirderDetail(row, await findStrandRows(db, id));
}

/** The catalogue type a record names, with its overrides checked against the type's own dimensions. */
async function typeSectionFor(db: Database | Transaction, record: GirderRecord): Promise<Record<string, unknown> | null> {
  if (record.girderTypeId === null) return null;
  return checkedTypeSection(await findGirderTypeById(db, record.girderTypeId), record);
}

/** The section of the type found for a record's type id, when the record's overrides name only its dimensions. */
function checkedTypeSection(type: GirderTypeRow | undefined, record: GirderRecord): Record<string, unknown> {
  if (!type) throw AppError.invalidFields([{ field: 'girderTypeId', message: `there is no girder type with id ${record.girderTypeId}` }]);
  const unknownKeys = Object.keys(record.sectionOverrides).filter((key) => typeof type.section[key] !== 'number');
  if (unknownKeys.length > 0) {
    throw AppError.invalidFields(unknownKeys.map((key) => ({ field: `sectionOverrides.${key}`, message: `the ${type.name} section has no dimension "${key}"` })));
  }
  return type.section;
}

/** A rating calculation file of the girder as stored in its span, with the given damage; traffic, condition and vehicle only complete it. */
function rateFileOf(record: GirderRecord, typeSection: Record<string, unknown> | null, span: StoredSpan, girderNumber: number, skewDeg: number, damage: readonly DamageEntry[] = []) {
  const { columns, strandRows } = girderColumnsOf(record);
  const stored: StoredGirder = { girder: { ...columns, girder_number: girderNumber }, typeSection, strandRows };
  return {
    units: 'si',
    ...girderCalcFileParts(stored, span, skewDeg),
    damage,
    condition: { superstructure: 9 },
    traffic: { adtt: 0 },
    vehicles: [LIBRARY_VEHICLE_IDS[0]],
  };
}

/**
 * Checks the girder the way a rating will read it: assembles the rating calculation file from the
 * record and its span and lets the engine's own schema judge it, naming each problem by its
 * place in the record. A girder that passes can always be rated. `passed` holds what has passed
 * already (`rateInputsDigest`): such a girder is not checked again. `recordDigest` is the record's
 * `girderRecordDigest` when the caller has it already.
 */
function assertRateable(
  record: GirderRecord,
  typeSection: Record<string, unknown> | null,
  span: StoredSpan,
  girderNumber: number,
  skewDeg: number,
  passed?: Set<string>,
  recordDigest?: string | null,
): void {
  const key = passed ? rateInputsDigest(record, recordDigest === undefined ? girderRecordDigest(record) : recordDigest, typeSection, span, girderNumber, skewDeg) : null;
  if (key !== null && passed!.has(key)) return;
  const parsed = parseRateFile(rateFileOf(record, typeSection, span, girderNumber, skewDeg));
  if (!parsed.ok) throw AppError.invalidFields(parsed.issues.map((issue) => ({ field: recordPathOf(issue.path, record), message: issue.message })));
  if (key !== null) passed!.add(key);
}

/**
 * The girder record's part of what its calculation file is made of — all of it, strand rows and
 * catalogue type id included — as a SHA-256 digest of its JSON text; null when that text would
 * not say all of it (see `isPlainJson`). An import's check works it out once a girder and keeps
 * it with the row, so that the commit knows the girder without writing its record as text again.
 */
export function girderRecordDigest(record: GirderRecord): string | null {
  return isPlainJson(record) ? hash('sha256', JSON.stringify(record), 'base64') : null;
}

/**
 * Everything `rateFileOf` makes a girder's calculation file of — record (by `girderRecordDigest`),
 * catalogue section, the span's fields the engine reads, girder number, skew — with the engine's
 * version, as one SHA-256 digest: the engine's check is a pure function of the file, and the
 * girders of a span, and the spans of a structure, are often alike, so an import checks each
 * distinct girder once. The record's catalogue type id is named beside its digest, so a digest
 * kept by an earlier check stands only for a record with the same type. Null when JSON text would
 * not say all of an input: then the girder is simply checked.
 */
function rateInputsDigest(
  record: GirderRecord,
  recordDigest: string | null,
  typeSection: Record<string, unknown> | null,
  span: StoredSpan,
  girderNumber: number,
  skewDeg: number,
): string | null {
  const placeDigest = sectionAndSpanDigest(typeSection, span);
  if (placeDigest === null || recordDigest === null || !isPlainJson(girderNumber) || !isPlainJson(skewDeg)) return null;
  return hash('sha256', `${girderNumber}|${skewDeg}|${record.girderTypeId}|${placeDigest}|${recordDigest}`, 'base64');
}

const sectionAndSpanDigestOf = new WeakMap<StoredSpan, Map<object | null, string | null>>();

/**
 * The engine's version, the catalogue section and the span's fields the engine reads, as one
 * digest, worked out once for each section and span object: many girders share them.
 */
function sectionAndSpanDigest(typeSection: Record<string, unknown> | null, span: StoredSpan): string | null {
  let ofSpan = sectionAndSpanDigestOf.get(span);
  if (!ofSpan) sectionAndSpanDigestOf.set(span, (ofSpan = new Map()));
  let digest = ofSpan.get(typeSection);
  if (digest === undefined) {
    const sectionText = sharedJsonText(typeSection);
    const spanText = storedSpanText(span);
    digest = sectionText === null || spanText === null ? null : hash('sha256', `${ENGINE_VERSION}|${sectionText}|${spanText}`, 'base64');
    ofSpan.set(typeSection, digest);
  }
  return digest;
}

const jsonTextOf = new WeakMap<object, string | null>();

/** The JSON text of an object many girders share, worked out once; null when JSON would not say all of it. Shared objects are read, never changed. */
function sharedJsonText(value: object | null): string | null {
  if (value === null) return 'null';
  let text = jsonTextOf.get(value);
  if (text === undefined) {
    text = isPlainJson(value) ? JSON.stringify(value) : null;
    jsonTextOf.set(value, text);
  }
  return text;
}

const storedSpanTextOf = new WeakMap<StoredSpan, string | null>();

/**
 * The text of the span's fields the engine reads (`STORED_SPAN_FIELDS`, in that order): a span
 * row holds more (its id, its stamps), which would make every span differ. Objects inside are
 * written with their keys sorted: read back from `jsonb`, a wearing surface has its keys in
 * another order than the file's row gave them, and is the same wearing surface.
 */
function storedSpanText(span: StoredSpan): string | null {
  let text = storedSpanTextOf.get(span);
  if (text === undefined) {
    const fields = STORED_SPAN_FIELDS.map((field) => span[field] ?? null);
    text = isPlainJson(fields) ? JSON.stringify(fields, sortedKeys) : null;
    storedSpanTextOf.set(span, text);
  }
  return text;
}

/**
 * What would stop the API writing this girder on this span, each problem at its place in the
 * record: a catalogue type whose section lacks a dimension the record overrides, or what the
 * engine finds wrong with the rating calculation file. Empty when the girder can be rated. An
 * import's check asks this of every girder it would write, with the span as the file leaves it,
 * and keeps each girder's `recordDigest` for its commit.
 */
export function girderRatingProblems(
  record: GirderRecord,
  type: GirderTypeRow | undefined,
  span: StoredSpan,
  girderNumber: number,
  skewDeg: number,
  rateableGirders: Set<string>,
  recordDigest: string | null = girderRecordDigest(record),
): readonly InvalidField[] {
  try {
    const typeSection = record.girderTypeId === null ? null : checkedTypeSection(type, record);
    assertRateable(record, typeSection, span, girderNumber, skewDeg, rateableGirders, recordDigest);
    return [];
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    return (error.details as { fields: InvalidField[] }).fields;
  }
}

/** A `JSON.stringify` replacer writing every object's keys in sorted order. */
function sortedKeys(_key: string, value: unknown): unknown {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return value;
  return Object.fromEntries(Object.entries(value).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

/**
 * Whether JSON text says all there is of a value — only plain objects, arrays, text, booleans,
 * null and finite numbers other than -0, nothing undefined — so that two values of one text are
 * the same value.
 */
function isPlainJson(value: unknown): boolean {
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return true;
    case 'number':
      return Number.isFinite(value) && !Object.is(value, -0);
    case 'object':
      if (value === null) return true;
      if (Array.isArray(value)) {
        for (const item of value) if (!isPlainJson(item)) return false;
        return true;
      }
      if (Object.getPrototypeOf(value) !== Object.prototype) return false;
      for (const key in value) if (!isPlainJson((value as Record<string, unknown>)[key])) return false;
      return true;
    default:
      return false;
  }
}

/**
 * What the engine finds wrong with damage entries on a stored girder — strands it does not have,
 * a spall outside its concrete, a place beyond its span — as issues at `damage[i]…` paths, so a
 * finding is refused on the same rules a rating will apply. Empty when all is well.
 */
export async function damageIssuesOnGirder(db: Database | Transaction, girderId: number, damage: readonly DamageEntry[]): Promise<readonly CalcFileIssue[]> {
  const row = await findGirderById(db, girderId);
  if (!row) throw girderNotFound(girderId);
  const record = toGirderRecord(row, await findStrandRows(db, girderId));
  const span = (await findSpanById(db, row.span_id))!;
  const structure = (await findStructureById(db, row.structure_id))!;
  const parsed = parseRateFile(rateFileOf(record, row.type_section, span, row.girder_number, structure.skew_deg, damage));
  return parsed.ok ? [] : parsed.issues.filter((issue) => issue.path.startsWith('damage'));
}

/**
 * Replaces a girder's record (strand rows as a whole) when the version read is current, inside the
 * user's districts, after the engine has accepted it; the history keeps each part that changed.
 */
export async function changeGirder({ db, user }: { db: Database; user: SignedInUser }, id: number, { version, ...record }: GirderChange): Promise<GirderDetail> {
  return withTransaction(db, async (trx) => {
    const row = await findGirderById(trx, id, { forUpdate: true });
    if (!row) throw girderNotFound(id);
    assertMayEditIn(user, row.district);
    const strandRows = await findStrandRows(trx, id);
    if (row.version !== version) throw AppError.versionConflict(`Girder ${row.girder_number} of span ${row.span_index}`, toGirderDetail(row, strandRows));

    const typeSection = await typeSectionFor(trx, record);
    const span = (await findSpanById(trx, row.span_id))!;
    const structure = (await findStructureById(trx, row.structure_id))!;
    assertRateable(record, typeSection, span, row.girder_number, structure.skew_deg);

    const changes = changedFields(toGirderRecord(row, strandRows), record);
    if (changes.fields.length === 0) return toGirderDetail(row, strandRows);
    const written = girderColumnsOf(record);
    if (!(await updateGirder(trx, id, version, written.columns, written.strandRows, user.id))) {
      throw AppError.versionConflict(`Girder ${row.girder_number}`, toGirderDetail(row, strandRows));
    }
    await recordAuditEvent({ db: trx, user, action: 'girder.changed', entity: { type: 'girder', id }, before: changes.before, after: changes.after });
    // What a rating of the span reads has changed.
    await markSpansReratingDue(trx, [row.span_id]);
    return toGirderDetail((await findGirderById(trx, id))!, await findStrandRows(trx, id));
  });
}

/**
 * Adds a girder to a span (inside the user's districts): its record checked the way a rating
 * will read it, as a change is, with a history entry. The caller sets the span's girder count
 * once all its girders are written (a span never has fewer than two).
 */
export async function createGirder({ db, user }: { db: Database; user: SignedInUser }, spanId: number, girderNumber: number, record: GirderRecord): Promise<GirderDetail> {
  return withTransaction(db, async (trx) => {
    const id = onlyCreatedId(await createGirders({ db: trx, user }, [{ spanId, girderNumber, record }]));
    return toGirderDetail((await findGirderById(trx, id))!, await findStrandRows(trx, id));
  });
}

/** A girder to add: the span it goes on, its number there, its record. */
export interface NewGirder {
  readonly spanId: number;
  readonly girderNumber: number;
  readonly record: GirderRecord;
  /** The record's `girderRecordDigest`, when the caller has it (an import's check kept it with the row). */
  readonly recordDigest?: string | null;
}

/**
 * Adds many girders on the rules of `createGirder` — districts, catalogue type, the engine's
 * check — reading their spans and the catalogue once and writing in a few statements, which is
 * what lets an import of tens of thousands finish in seconds. Each refused girder is named by its
 * index; the others are written. `rateableGirders` holds the digests of girders the engine has
 * passed already (`girderRatingProblems`, an import's check); it gains those passed here.
 */
export async function createGirders(
  { db, user }: { db: Database | Transaction; user: SignedInUser },
  girders: readonly NewGirder[],
  { rateableGirders = new Set<string>() }: { rateableGirders?: Set<string> } = {},
): Promise<ManyCreated> {
  let created: ManyCreated = { ids: [], refused: new Map() };
  const onePage = (async function* () {
    yield girders;
  })();
  await createGirdersPageByPage({ db, user }, [...new Set(girders.map((girder) => girder.spanId))], onePage, { rateableGirders, onWritten: (_page, written) => (created = written) });
  return created;
}

/** What `createGirdersPageByPage` reports of a page once it is written: as `createGirders` answers for those girders. */
export type GirdersPageWritten = (page: readonly NewGirder[], created: ManyCreated) => void;

/**
 * `createGirders` for girders that come a page at a time (an import's checked rows), on spans
 * among `spanIds`: the engine checks the next page while the database writes this one, so
 * neither waits for the other. `onWritten` is told of each page in order, once its girders are
 * written; a page's spans become due for re-rating.
 */
export async function createGirdersPageByPage(
  { db, user }: { db: Database | Transaction; user: SignedInUser },
  spanIds: readonly number[],
  pages: AsyncIterable<readonly NewGirder[]>,
  { rateableGirders = new Set<string>(), onWritten }: { rateableGirders?: Set<string>; onWritten: GirdersPageWritten },
): Promise<void> {
  await withTransaction(db, async (trx) => {
    const spans = new Map((await findSpansWithPlace(trx, spanIds)).map((span) => [span.id, span]));
    const types = new Map((await findGirderTypes(trx)).map((type) => [type.id, type]));
    const writes = new WritesInFlight();
    const pagesBeingWritten: Promise<void>[] = [];
    try {
      for await (const page of pages) {
        // The engine keeps one page ahead of the database, not the whole file: each page waiting holds its statements in memory.
        if (pagesBeingWritten.length > PAGES_AHEAD) await pagesBeingWritten.shift();
        const refused = new Map<number, AppError>();
        const idsInOrder: (number | null)[] = page.map(() => null);
        const stepsWritten: Promise<void>[] = [];
        for (let start = 0; start < page.length; start += GIRDERS_PER_STEP) {
          const accepted: AcceptedGirder[] = [];
          for (let index = start; index < Math.min(start + GIRDERS_PER_STEP, page.length); index += 1) {
            try {
              accepted.push({ index, girder: page[index]!, insert: checkedNewGirder(user, spans.get(page[index]!.spanId), types, page[index]!, rateableGirders) });
            } catch (error) {
              if (!(error instanceof AppError)) throw error;
              refused.set(index, error);
            }
            if ((index + 1) % CHECKS_BETWEEN_TURNS === 0) await writes.letThemGo();
          }
          const stepWritten = writeCheckedGirders(trx, user, accepted, idsInOrder);
          stepsWritten.push(stepWritten);
          writes.send(stepWritten);
          await writes.letThemGo();
        }
        const written = Promise.all(stepsWritten).then(() => pageWritten(trx, page, { ids: idsInOrder, refused }, onWritten));
        writes.send(written);
        pagesBeingWritten.push(written);
      }
    } finally {
      await writes.drain();
    }
  });
}

/** Pages checked while the one before them is still being written. */
const PAGES_AHEAD = 1;

/**
 * Girders checked between turns of the event loop: the connection sends the next statement
 * waiting only in a turn, so the database would otherwise sit idle while the engine checks.
 */
const CHECKS_BETWEEN_TURNS = 50;

/** A page's girders all written: their spans become due for re-rating, and the caller is told. */
async function pageWritten(trx: Transaction, page: readonly NewGirder[], created: ManyCreated, onWritten: GirdersPageWritten): Promise<void> {
  onWritten(page, created);
  await markSpansReratingDue(trx, [...new Set(page.flatMap((girder, index) => (created.ids[index] === null ? [] : [girder.spanId])))]);
}

/**
 * Girders checked at a time: while the database writes one step's girders, the engine checks
 * the next step's. Steps are sent without waiting, so the engine runs ahead by as many as the
 * database has not yet written. Few large steps beat many small ones: a statement leaves only in
 * a turn of the event loop, and the database waits for each (`npm run bench`, 50 000 girders:
 * steps of 500 committed in about 6.3 s, of 2 500 in 5.8 s, of 5 000 in 5.9 s). A step's
 * girders, strand rows and history entries are a statement each (`ROWS_PER_INSERT`,
 * `EVENTS_PER_INSERT`).
 */
const GIRDERS_PER_STEP = 2500;

interface AcceptedGirder {
  readonly index: number;
  readonly girder: NewGirder;
  readonly insert: GirderInsert;
}

/** One step's checked girders written with their history; their new ids set at their indexes. */
async function writeCheckedGirders(trx: Transaction, user: SignedInUser, accepted: readonly AcceptedGirder[], idsInOrder: (number | null)[]): Promise<void> {
  const ids = await insertGirders(trx, accepted.map((each) => each.insert), user.id);
  await recordAuditEvents(
    trx,
    user,
    accepted.map(({ girder: { spanId, girderNumber, record } }, at) => ({ action: 'girder.created', entity: { type: 'girder', id: ids[at]! }, after: { spanId, girderNumber, ...record } })),
  );
  accepted.forEach((each, at) => (idsInOrder[each.index] = ids[at]!));
}

/** One new girder checked against its span, the user's districts and the catalogue, as the columns to insert. */
function checkedNewGirder(
  user: SignedInUser,
  span: (SpanRow & { district: string; skew_deg: number }) | undefined,
  types: ReadonlyMap<number, GirderTypeRow>,
  { spanId, girderNumber, record, recordDigest }: NewGirder,
  rateableGirders: Set<string>,
): GirderInsert {
  if (!span) throw AppError.notFound(`There is no span with id ${spanId}`);
  assertMayEditIn(user, span.district);
  const typeSection = record.girderTypeId === null ? null : checkedTypeSection(types.get(record.girderTypeId), record);
  assertRateable(record, typeSection, span, girderNumber, span.skew_deg, rateableGirders, recordDigest);
  const written = girderColumnsOf(record);
  return { spanId, girderNumber, columns: written.columns, strandRows: written.strandRows };
}
