import type { SignedInUser, SpanChange, SpanDetail } from '../../../shared/src';
import { recordAuditEvent, recordAuditEvents } from '../audit/audit-events';
import { changedFields } from '../audit/changed-fields';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { onlyCreatedId, type ManyCreated } from '../db/many-created';
import { markSpansReratingDue } from '../ratings/ratings.repository';
import { AppError } from '../http/app-error';
import { findDistrictsOfStructures, findStructureById } from '../structures/structures.repository';
import { assertMayEditIn } from '../structures/structures.service';
import { findSpanById, findSpansOfStructure, insertSpans, updateSpan, type SpanColumns, type SpanRow } from './spans.repository';

type SpanChangeFields = Omit<SpanChange, 'version'>;

const COLUMN_OF: Readonly<Record<keyof SpanChangeFields, keyof SpanColumns>> = {
  lengthM: 'length_m',
  girderSpacingMm: 'girder_spacing_mm',
  overhangMm: 'overhang_mm',
  roadwayWidthMm: 'roadway_width_mm',
  barrierFaceToGirderMm: 'barrier_face_to_girder_mm',
  deckThicknessMm: 'deck_thickness_mm',
  haunchMm: 'haunch_mm',
  wearingSurface: 'wearing_surface',
  barriers: 'barriers',
  diaphragms: 'diaphragms',
};

export function toSpanDetail(row: SpanRow): SpanDetail {
  return {
    id: row.id,
    structureId: row.structure_id,
    spanIndex: row.span_index,
    lengthM: row.length_m,
    girderCount: row.girder_count,
    girderSpacingMm: row.girder_spacing_mm,
    overhangMm: row.overhang_mm,
    roadwayWidthMm: row.roadway_width_mm,
    barrierFaceToGirderMm: row.barrier_face_to_girder_mm,
    deckThicknessMm: row.deck_thickness_mm,
    haunchMm: row.haunch_mm,
    wearingSurface: row.wearing_surface,
    barriers: row.barriers,
    diaphragms: row.diaphragms,
    supportType: row.support_type,
    version: row.version,
    updated: { at: row.updated_at.toISOString(), by: row.updated_by_name },
  };
}

/** The fields a change may touch, as the API names them, from the stored row. */
/** A stored span's fields as its change body names them. */
export function editableFields(row: SpanRow): Record<keyof SpanChangeFields, unknown> {
  const detail = toSpanDetail(row);
  return Object.fromEntries(Object.keys(COLUMN_OF).map((field) => [field, detail[field as keyof SpanDetail]])) as Record<keyof SpanChangeFields, unknown>;
}

export async function listSpansOfStructure({ db }: { db: Database }, structureId: number): Promise<SpanDetail[]> {
  if (!(await findStructureById(db, structureId))) throw AppError.notFound(`There is no structure with id ${structureId}`);
  return (await findSpansOfStructure(db, structureId)).map(toSpanDetail);
}

const notFound = (id: number) => AppError.notFound(`There is no span with id ${id}`);

export async function getSpan({ db }: { db: Database }, id: number): Promise<SpanDetail> {
  const row = await findSpanById(db, id);
  if (!row) throw notFound(id);
  return toSpanDetail(row);
}

/** Diaphragms must stay on the span, also when only the length changes. */
function assertDiaphragmsOnSpan(lengthM: number, diaphragms: SpanDetail['diaphragms']): void {
  const fields = diaphragms.flatMap((diaphragm, index) =>
    diaphragm.xM > lengthM ? [{ field: `diaphragms.${index}.xM`, message: `lies beyond the span (${lengthM} m)` }] : [],
  );
  if (fields.length === 0) return;
  throw AppError.invalidFields(fields);
}

/** Changes a span when the client's version is current (else 409), inside the user's districts, with a history entry. */
export async function changeSpan({ db, user }: { db: Database; user: SignedInUser }, id: number, { version, ...fields }: SpanChange): Promise<SpanDetail> {
  return withTransaction(db, async (trx) => {
    const row = await findSpanById(trx, id, { forUpdate: true });
    if (!row) throw notFound(id);
    const structure = await findStructureById(trx, row.structure_id);
    assertMayEditIn(user, structure!.district);
    if (row.version !== version) throw AppError.versionConflict(`Span ${row.span_index} of ${structure!.structure_number}`, toSpanDetail(row));

    const changes = changedFields(editableFields(row), fields);
    if (changes.fields.length === 0) return toSpanDetail(row);
    assertDiaphragmsOnSpan(fields.lengthM ?? row.length_m, fields.diaphragms ?? row.diaphragms);

    const columns = Object.fromEntries(changes.fields.map((field) => [COLUMN_OF[field as keyof SpanChangeFields], changes.after[field]])) as SpanColumns;
    if (!(await updateSpan(trx, id, version, columns, user.id))) throw AppError.versionConflict(`Span ${row.span_index}`, toSpanDetail(row));
    await recordAuditEvent({ db: trx, user, action: 'span.changed', entity: { type: 'span', id }, before: changes.before, after: changes.after });
    // What a rating of the span reads has changed.
    await markSpansReratingDue(trx, [id]);
    return toSpanDetail((await findSpanById(trx, id))!);
  });
}

/** The fields of a new span: every field a span has, as `PATCH /api/spans/:id` names them. */
export type NewSpanFields = Required<SpanChangeFields>;

/**
 * Adds a span to a structure (inside the user's districts), simply supported, with the number of
 * girders that will be written on it (at least two), and a history entry. The span is due for a
 * rating from the start.
 */
export async function createSpan({ db, user }: { db: Database; user: SignedInUser }, structureId: number, spanIndex: number, fields: NewSpanFields, girderCount: number): Promise<SpanDetail> {
  return withTransaction(db, async (trx) => {
    const id = onlyCreatedId(await createSpans({ db: trx, user }, [{ structureId, spanIndex, fields, girderCount }]));
    return toSpanDetail((await findSpanById(trx, id))!);
  });
}

/** A span to add: the structure it goes on, its index there, its fields and how many girders it will carry. */
export interface NewSpan {
  readonly structureId: number;
  readonly spanIndex: number;
  readonly fields: NewSpanFields;
  readonly girderCount: number;
}

/** Adds many spans on the rules of `createSpan`, reading their structures once and writing in a few statements; each refused span is named by its index. */
export async function createSpans({ db, user }: { db: Database | Transaction; user: SignedInUser }, spans: readonly NewSpan[]): Promise<ManyCreated> {
  return withTransaction(db, async (trx) => {
    const districtOf = await findDistrictsOfStructures(trx, [...new Set(spans.map((span) => span.structureId))]);
    const refused = new Map<number, AppError>();
    const accepted: { index: number; span: NewSpan }[] = [];
    spans.forEach((span, index) => {
      try {
        const district = districtOf.get(span.structureId);
        if (district === undefined) throw AppError.notFound(`There is no structure with id ${span.structureId}`);
        assertMayEditIn(user, district);
        assertDiaphragmsOnSpan(span.fields.lengthM, span.fields.diaphragms);
        accepted.push({ index, span });
      } catch (error) {
        if (!(error instanceof AppError)) throw error;
        refused.set(index, error);
      }
    });
    const ids = await insertSpans(trx, accepted.map(({ span }) => ({ ...span, columns: columnsOf(span.fields) })), user.id);
    await recordAuditEvents(
      trx,
      user,
      accepted.map(({ span: { structureId, spanIndex, fields } }, at) => ({ action: 'span.created', entity: { type: 'span', id: ids[at]! }, after: { structureId, spanIndex, ...fields } })),
    );
    const idsInOrder: (number | null)[] = spans.map(() => null);
    accepted.forEach((each, at) => (idsInOrder[each.index] = ids[at]!));
    return { ids: idsInOrder, refused };
  });
}

function columnsOf(fields: NewSpanFields): Required<SpanColumns> {
  return spanColumnsOf(fields) as Required<SpanColumns>;
}

/** The columns of the span fields given; fields left out are left out. */
export function spanColumnsOf(fields: Partial<SpanChangeFields>): SpanColumns {
  const columns: Record<string, unknown> = {};
  for (const [field, column] of Object.entries(COLUMN_OF)) if (field in fields) columns[column] = fields[field as keyof SpanChangeFields];
  return columns as SpanColumns;
}
