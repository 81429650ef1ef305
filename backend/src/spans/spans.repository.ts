import type { Knex } from 'knex';
import type { SpanDetail } from '../../../shared/src';
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
  return spansWithStamps(db).whereIn('sp.structure_id', structureIds).orderBy(['sp.structure_id', 'sp.span_index']);
}

export async function findSpanById(db: Db, id: number, { forUpdate = false } = {}): Promise<SpanRow | undefined> {
  const query = spansWithStamps(db).where('sp.id', id).first();
  if (forUpdate) query.forUpdate('sp');
  return query;
}

/** JSON columns go to the driver as text: node-postgres would write a JavaScript array as a PostgreSQL array. */
const JSON_COLUMNS = new Set(['wearing_surface', 'barriers', 'diaphragms']);

/** Writes the changed columns when the row still has the version the change was made from; false when it has moved on. */
export async function updateSpan(trx: Transaction, id: number, expectedVersion: number, columns: SpanColumns, userId: number): Promise<boolean> {
  const values = Object.fromEntries(Object.entries(columns).map(([column, value]) => [column, JSON_COLUMNS.has(column) && value !== null ? JSON.stringify(value) : value]));
  const updated = await trx('spans')
    .where({ id, version: expectedVersion })
    .update({ ...values, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return updated === 1;
}

/** A new span of a structure, simply supported; its girder count follows the girders written with it. */
export async function insertSpan(trx: Transaction, structureId: number, spanIndex: number, columns: Required<SpanColumns>, girderCount: number, userId: number): Promise<number> {
  const values = Object.fromEntries(Object.entries(columns).map(([column, value]) => [column, JSON_COLUMNS.has(column) && value !== null ? JSON.stringify(value) : value]));
  const [row] = await trx('spans')
    .insert({ ...values, structure_id: structureId, span_index: spanIndex, girder_count: girderCount, support_type: 'simple', created_by: userId, updated_by: userId })
    .returning('id');
  return (row as { id: number }).id;
}

/** Sets a span's girder count to the girders stored on it. */
export async function recountGirders(trx: Transaction, spanId: number): Promise<void> {
  await trx.raw('update spans set girder_count = (select count(*) from girders where span_id = ?) where id = ?', [spanId, spanId]);
}
