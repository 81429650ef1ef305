import type { PhotoContentType } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

type Db = Database | Transaction;

/** One row of `photos` with the name of whoever uploaded it. */
export interface PhotoRow {
  id: number;
  inspection_id: number;
  finding_id: number | null;
  object_key: string;
  thumbnail_key: string;
  content_type: PhotoContentType;
  byte_size: number;
  width_px: number;
  height_px: number;
  original_name: string;
  uploaded_at: Date;
  uploaded_by_name: string;
}

export type NewPhotoColumns = Pick<
  PhotoRow,
  'inspection_id' | 'finding_id' | 'object_key' | 'thumbnail_key' | 'content_type' | 'byte_size' | 'width_px' | 'height_px' | 'original_name'
>;

function photosWithNames(db: Db) {
  return db({ p: 'photos' })
    .join({ u: 'users' }, 'u.id', 'p.uploaded_by')
    .select(
      'p.id',
      'p.inspection_id',
      'p.finding_id',
      'p.object_key',
      'p.thumbnail_key',
      'p.content_type',
      'p.byte_size',
      'p.width_px',
      'p.height_px',
      'p.original_name',
      'p.uploaded_at',
      'u.display_name as uploaded_by_name',
    );
}

/** The photos of an inspection in the order they were taken in. */
export async function findPhotosOfInspection(db: Db, inspectionId: number): Promise<PhotoRow[]> {
  return photosWithNames(db).where('p.inspection_id', inspectionId).orderBy('p.uploaded_at').orderBy('p.id');
}

export async function findPhotoById(db: Db, id: number, { forUpdate = false } = {}): Promise<PhotoRow | undefined> {
  const query = photosWithNames(db).where('p.id', id).first();
  if (forUpdate) query.forUpdate('p');
  return query;
}

/** Whether the finding was recorded in this inspection (findings of other inspections may not be pointed at). */
export async function isFindingOfInspection(db: Db, findingId: number, inspectionId: number): Promise<boolean> {
  return (await db('findings').where({ id: findingId, inspection_id: inspectionId }).first('id')) !== undefined;
}

export async function insertPhoto(trx: Transaction, columns: NewPhotoColumns, userId: number): Promise<number> {
  const [row] = await trx('photos')
    .insert({ ...columns, uploaded_by: userId, created_by: userId, updated_by: userId })
    .returning<{ id: number }[]>('id');
  return row!.id;
}

export async function deletePhotoRow(trx: Transaction, id: number): Promise<void> {
  await trx('photos').where({ id }).delete();
}

/** The photo ids of each of the findings, in the order they were taken in. */
export async function findPhotoIdsOfFindings(db: Db, findingIds: readonly number[]): Promise<Map<number, number[]>> {
  const ids = new Map<number, number[]>();
  if (findingIds.length === 0) return ids;
  const rows: { id: number; finding_id: number }[] = await db('photos').whereIn('finding_id', findingIds).orderBy(['uploaded_at', 'id']).select('id', 'finding_id');
  for (const row of rows) ids.set(row.finding_id, [...(ids.get(row.finding_id) ?? []), row.id]);
  return ids;
}
