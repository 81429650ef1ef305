import type { Knex } from 'knex';
import type { SpanDetail } from '../../../shared/src';
import { inChunks } from '../db/many-created';
import type { Database, Transaction } from '../db/database';

type Db = Database | Transaction;

/** One row of `spans` with the name of whoever changed it last. */
export interface SpanRow {
  id: number;
  structure_id: number;
  span_index: number;
  length_m: number;
  girder_count: number;
  girder_spacing_mm: number;
  overhang_mm: number;
  roadway_width_mm: number;
  barrier_face_to_girder_mm: number | null;
  deck_thickness_mm: number;
  haunch_mm: number;
  wearing_surface: SpanDetail['wearingSurface'];
  barriers: SpanDetail['barriers'];
  diaphragms: SpanDetail['diaphragms'];
  support_type: 'simple' | 'continuous';
  version: number;
  updated_at: Date;
  updated_by_name: string | null;
}

export type SpanColumns = Partial<
  Pick<SpanRow, 'length_m' | 'girder_spacing_mm' | 'overhang_mm' | 'roadway_width_mm' | 'barrier_face_to_girder_mm' | 'deck_thickness_mm' | 'haunch_mm' | 'wearing_surface' | 'barriers' | 'diaphragms'>
>;

function spansWithStamps(db: Db): Knex.QueryBuilder {
  return db({ sp: 'spans' })
    .leftJoin({ updated_by: 'users' }, 'updated_by.id', 'sp.updated_by')
    .select('sp.*', 'updated_by.display_name as updated_by_name');
}

export async function findSpansOfStructure(db: Db, structureId: number): Promise<SpanRow[]> {
  return spansWithStamps(db).where('sp.structure_id', structureId).orderBy('sp.span_index');
}

/** The spans of these structures, by structure and index. */
export async function findSpansOfStructures(db: Db, structureIds: readonly number[]): Promise<SpanRow[]> {
  if (structureIds.length === 0) return [];
  return spansWithStamps(db).whereRaw('sp.structure_id = any(?)', [[...structureIds]]).orderBy(['sp.structure_id', 'sp.span_index']);
}

export async function findSpanById(db: Db, id: number, { forUpdate = false } = {}): Promise<SpanRow | undefined> {
  const query = spansWithStamps(db).where('sp.id', id).first();
  if (forUpdate) query.forUpdate('sp');
  return query;
}

/** JSON columns go to the driver as text: node-postgres would write a JavaScript array as a PostgreSQL array. */
const JSON_COLUMNS = new Set(['wearing_surface', 'barriers', 'diaphragms']);

function spanValues(columns: SpanColumns): Record<string, unknown> {
  return Object.fromEntries(Object.entries(columns).map(([column, value]) => [column, JSON_COLUMNS.has(column) && value !== null ? JSON.stringify(value) : value]));
}

/** Writes the changed columns when the row still has the version the change was made from; false when it has moved on. */
export async function updateSpan(trx: Transaction, id: number, expectedVersion: number, columns: SpanColumns, userId: number): Promise<boolean> {
  const values = spanValues(columns);
  const updated = await trx('spans')
    .where({ id, version: expectedVersion })
    .update({ ...values, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return updated === 1;
}

/** A new span of a structure, simply supported; its girder count follows the girders written with it. */
/** A span to insert: where it goes, its columns, how many girders it carries. */
export interface SpanInsert {
  readonly structureId: number;
  readonly spanIndex: number;
  readonly columns: Required<SpanColumns>;
  readonly girderCount: number;
}

/** Rows per insert statement: a span row has about 20 columns, so this stays far under 65 535 parameters. */
const ROWS_PER_INSERT = 1000;

/** Inserts simply supported spans, due for a rating, in a few statements; gives back their ids in the order given. */
export async function insertSpans(trx: Transaction, spans: readonly SpanInsert[], userId: number): Promise<number[]> {
  const ids: number[] = [];
  for (const chunk of inChunks(spans, ROWS_PER_INSERT)) {
    const inserted: { id: number; structure_id: number; span_index: number }[] = await trx('spans')
      .insert(
        chunk.map((span) => ({
          ...spanValues(span.columns),
          structure_id: span.structureId,
          span_index: span.spanIndex,
          girder_count: span.girderCount,
          support_type: 'simple',
          // A new span is due for a rating from the start.
          rerating_due_since: trx.fn.now(),
          created_by: userId,
          updated_by: userId,
        })),
      )
      .returning(['id', 'structure_id', 'span_index']);
    // Matched by (structure, index), which is unique, rather than trusting the order RETURNING gives.
    const idOf = new Map(inserted.map((row) => [`${row.structure_id}/${row.span_index}`, row.id]));
    ids.push(...chunk.map((span) => idOf.get(`${span.structureId}/${span.spanIndex}`)!));
  }
  return ids;
}

/** Sets each span's girder count to the girders stored on it; a span whose count is right already is not written again. */
export async function recountGirders(trx: Transaction, spanIds: readonly number[]): Promise<void> {
  if (spanIds.length === 0) return;
  await trx.raw(
    `update spans as sp set girder_count = counted.girders
       from (select s.id, count(g.id) as girders from spans as s left join girders as g on g.span_id = s.id where s.id = any(?) group by s.id) as counted
      where sp.id = counted.id and sp.girder_count <> counted.girders`,
    [[...spanIds]],
  );
}

/** These spans, each with the district and skew of its structure (what writing girders on them is checked against). */
export async function findSpansWithPlace(db: Db, ids: readonly number[]): Promise<(SpanRow & { district: string; skew_deg: number })[]> {
  if (ids.length === 0) return [];
  return spansWithStamps(db).join({ s: 'structures' }, 's.id', 'sp.structure_id').select('s.district', 's.skew_deg').whereRaw('sp.id = any(?)', [[...ids]]);
}
