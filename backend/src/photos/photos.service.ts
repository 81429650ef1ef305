import { randomUUID } from 'node:crypto';
import type { PhotoContentType, PhotoSummary, SignedInUser } from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { AppError } from '../http/app-error';
import { inspectionOpenForChange } from '../inspections/inspection-access';
import { findInspectionById } from '../inspections/inspections.repository';
import type { ObjectStorage, StoredObject } from './object-storage';
import { unsupportedPhoto, uploadFieldError } from './photo-errors';
import { preparePhoto } from './photo-image';
import { EXTENSION_OF, photoTypeOf } from './photo-type';
import { deletePhotoRow, findPhotoById, findPhotosOfInspection, insertPhoto, isFindingOfInspection, type PhotoRow } from './photos.repository';

interface PhotoContext {
  readonly db: Database;
  readonly storage: ObjectStorage;
}

/** A file received in the upload form, before anything about it is trusted. */
export interface PhotoUpload {
  readonly bytes: Buffer;
  readonly originalName: string;
  readonly findingId: number | null;
}

export function toPhotoSummary(row: PhotoRow): PhotoSummary {
  return {
    id: row.id,
    inspectionId: row.inspection_id,
    findingId: row.finding_id,
    contentType: row.content_type,
    byteSize: row.byte_size,
    widthPx: row.width_px,
    heightPx: row.height_px,
    originalName: row.original_name,
    uploaded: { at: row.uploaded_at.toISOString(), by: row.uploaded_by_name },
  };
}

/** What the history keeps of a photo: everything but its id and stamp, which the event itself carries. */
function auditedFields({ inspectionId, findingId, contentType, byteSize, widthPx, heightPx, originalName }: PhotoSummary) {
  return { inspectionId, findingId, contentType, byteSize, widthPx, heightPx, originalName };
}

const photoNotFound = (id: number) => AppError.notFound(`There is no photo with id ${id}`);

export async function listPhotosOfInspection({ db }: { db: Database }, inspectionId: number): Promise<PhotoSummary[]> {
  if (!(await findInspectionById(db, inspectionId))) throw AppError.notFound(`There is no inspection with id ${inspectionId}`);
  return (await findPhotosOfInspection(db, inspectionId)).map(toPhotoSummary);
}

/** Locks the inspection for a photo change by this user, and checks that the finding, if any, is one of its own. */
async function openForPhotos(trx: Transaction, user: SignedInUser, inspectionId: number, findingId: number | null): Promise<void> {
  await inspectionOpenForChange(trx, user, inspectionId);
  if (findingId !== null && !(await isFindingOfInspection(trx, findingId, inspectionId))) {
    throw uploadFieldError('validation_failed', 400, 'findingId', `finding ${findingId} is not a finding of inspection ${inspectionId}`);
  }
}

/** Where a new photo's files go: both under the inspection, named by one random id. */
function newObjectKeys(inspectionId: number, contentType: PhotoContentType) {
  const stem = `inspections/${inspectionId}/${randomUUID()}`;
  return { original: `${stem}.${EXTENSION_OF[contentType]}`, thumbnail: `${stem}-thumbnail.jpg` };
}

/**
 * Adds a photo to an inspection its author may still change. The type comes from the file's
 * first bytes and sharp must read it; the original (byte for byte) and its thumbnail go to the
 * store first, then the row and its history commit together. When the store fails nothing is
 * written (502); when the database fails the files just stored are removed again.
 */
export async function addPhoto({ db, storage, user }: PhotoContext & { user: SignedInUser }, inspectionId: number, upload: PhotoUpload): Promise<PhotoSummary> {
  // Refuse who and where before spending time on the image; the lock is released at once.
  await withTransaction(db, (trx) => openForPhotos(trx, user, inspectionId, upload.findingId));
  const contentType = photoTypeOf(upload.bytes);
  if (!contentType) throw unsupportedPhoto('the file is not a JPEG, PNG or WebP image (judged by its content, not by its name)');
  const image = await preparePhoto(upload.bytes, contentType);

  const keys = newObjectKeys(inspectionId, contentType);
  await storage.putAll([
    { key: keys.original, body: upload.bytes, contentType },
    { key: keys.thumbnail, body: image.thumbnail, contentType: 'image/jpeg' },
  ]);
  try {
    return await withTransaction(db, async (trx) => {
      // Checked again under the lock: the inspection may have been submitted while the files were stored.
      await openForPhotos(trx, user, inspectionId, upload.findingId);
      const id = await insertPhoto(
        trx,
        {
          inspection_id: inspectionId,
          finding_id: upload.findingId,
          object_key: keys.original,
          thumbnail_key: keys.thumbnail,
          content_type: contentType,
          byte_size: upload.bytes.length,
          width_px: image.widthPx,
          height_px: image.heightPx,
          original_name: upload.originalName,
        },
        user.id,
      );
      const photo = toPhotoSummary((await findPhotoById(trx, id))!);
      await recordAuditEvent({ db: trx, user, action: 'photo.added', entity: { type: 'photo', id }, after: auditedFields(photo) });
      return photo;
    });
  } catch (error) {
    await storage.deleteQuietly([keys.original, keys.thumbnail]);
    throw error;
  }
}

/** A photo's file as the store hands it out, with the type the browser is told. */
export type PhotoFile = StoredObject & { readonly contentType: PhotoContentType };

/** A photo's file for the browser: the original as uploaded, or its JPEG thumbnail. */
export async function openPhotoFile({ db, storage }: PhotoContext, id: number, variant: 'original' | 'thumbnail'): Promise<PhotoFile> {
  const row = await findPhotoById(db, id);
  if (!row) throw photoNotFound(id);
  if (variant === 'thumbnail') return { ...(await storage.open(row.thumbnail_key)), contentType: 'image/jpeg' };
  return { ...(await storage.open(row.object_key)), contentType: row.content_type };
}

/** Removes a photo its author may still change: the row and its history commit first, then the files go. */
export async function deletePhoto({ db, storage, user }: PhotoContext & { user: SignedInUser }, id: number): Promise<void> {
  const removed = await withTransaction(db, async (trx) => {
    const found = await findPhotoById(trx, id);
    if (!found) throw photoNotFound(id);
    // The inspection is locked before the photo, in the same order an upload takes them.
    await inspectionOpenForChange(trx, user, found.inspection_id);
    const row = await findPhotoById(trx, id, { forUpdate: true });
    if (!row) throw photoNotFound(id);
    await deletePhotoRow(trx, id);
    await recordAuditEvent({ db: trx, user, action: 'photo.deleted', entity: { type: 'photo', id }, before: auditedFields(toPhotoSummary(row)) });
    return row;
  });
  await storage.deleteQuietly([removed.object_key, removed.thumbnail_key]);
}
