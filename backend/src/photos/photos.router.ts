import { Router, type Response } from 'express';
import { pipeline } from 'node:stream/promises';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom } from '../http/validate';
import type { ObjectStorage } from './object-storage';
import { photoUploadFrom, receivePhoto } from './photo-upload';
import { addPhoto, deletePhoto, listPhotosOfInspection, openPhotoFile, type PhotoFile } from './photos.service';

export interface PhotosRouterOptions {
  readonly db: Database;
  readonly storage: ObjectStorage;
  readonly sizeLimitBytes: number;
}

/** A photo never changes under its id, so each browser may keep it a day; `private` keeps shared caches out. */
const PHOTO_CACHE_CONTROL = 'private, max-age=86400';

async function sendFile(res: Response, file: PhotoFile): Promise<void> {
  res.setHeader('Content-Type', file.contentType);
  if (file.byteLength !== null) res.setHeader('Content-Length', String(file.byteLength));
  res.setHeader('Cache-Control', PHOTO_CACHE_CONTROL);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  await pipeline(file.body, res);
}

export function photosRouter({ db, storage, sizeLimitBytes }: PhotosRouterOptions): Router {
  const router = Router();
  router.get('/inspections/:id/photos', allow.to('view'), async (req, res) => {
    res.json(await listPhotosOfInspection({ db }, idFrom(req.params)));
  });
  router.post('/inspections/:id/photos', allow.to('editOwnInspections'), receivePhoto(sizeLimitBytes), async (req, res) => {
    const inspectionId = idFrom(req.params);
    res.status(201).json(await addPhoto({ db, storage, user: signedInUser(req) }, inspectionId, photoUploadFrom(req)));
  });
  router.get('/photos/:id', allow.to('view'), async (req, res) => {
    await sendFile(res, await openPhotoFile({ db, storage }, idFrom(req.params), 'original'));
  });
  router.get('/photos/:id/thumbnail', allow.to('view'), async (req, res) => {
    await sendFile(res, await openPhotoFile({ db, storage }, idFrom(req.params), 'thumbnail'));
  });
  router.delete('/photos/:id', allow.to('editOwnInspections'), async (req, res) => {
    await deletePhoto({ db, storage, user: signedInUser(req) }, idFrom(req.params));
    res.sendStatus(204);
  });
  return router;
}
