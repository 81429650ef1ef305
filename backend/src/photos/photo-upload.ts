import type { Request, RequestHandler } from 'express';
import multer, { MulterError } from 'multer';
import { z } from 'zod';
import { AppError } from '../http/app-error';
import { cleanUploadFileName, megabytes } from '../http/uploads';
import { idParameters, parseRequest } from '../http/validate';
import { photoTooLarge, uploadFieldError } from './photo-errors';
import type { PhotoUpload } from './photos.service';

/** The text fields the upload form may carry besides the file; an empty `findingId` means none. */
const uploadForm = z.strictObject({
  findingId: z.preprocess((value) => (value === '' ? undefined : value), idParameters.shape.id.optional()),
});

/** Why multer stopped reading the form, as the API's errors; anything else it met was a broken body. */
function uploadError(error: unknown, sizeLimitBytes: number): AppError {
  if (!(error instanceof MulterError)) {
    return new AppError({ code: 'malformed_body', status: 400, message: 'The request body is not a readable multipart/form-data form', cause: error });
  }
  switch (error.code) {
    case 'LIMIT_FILE_SIZE':
      return photoTooLarge(`the file is larger than the ${megabytes(sizeLimitBytes)} (${sizeLimitBytes} bytes) a photo may have`);
    case 'LIMIT_UNEXPECTED_FILE':
    case 'LIMIT_FILE_COUNT':
      return error.field === 'photo' || error.field === undefined
        ? uploadFieldError('validation_failed', 400, 'photo', 'send one file at a time')
        : uploadFieldError('validation_failed', 400, error.field, 'unknown file field; send the photo in the field photo');
    case 'LIMIT_FIELD_VALUE':
      return uploadFieldError('validation_failed', 400, error.field ?? '(root)', 'is too long');
    default:
      return uploadFieldError('validation_failed', 400, '(root)', `the form has more than it may carry (${error.message.toLowerCase()})`);
  }
}

/**
 * Reads a multipart/form-data upload into memory: one file in `photo`, no bigger than the limit
 * (checked while it arrives, so an oversized body is cut off early), and a few short text fields.
 */
export function receivePhoto(sizeLimitBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: sizeLimitBytes, files: 1, fields: 4, fieldSize: 64, parts: 5 },
    // Browsers send file names as UTF-8 without saying so.
    defParamCharset: 'utf8',
  }).single('photo');
  return (req, res, next) => {
    upload(req, res, (error?: unknown) => next(error ? uploadError(error, sizeLimitBytes) : undefined));
  };
}

/** The file and fields `receivePhoto` read; 400 naming `photo` when no file came, or naming a bad field. */
export function photoUploadFrom(req: Request): PhotoUpload {
  const form = parseRequest(uploadForm, { ...req.body }, 'body field');
  if (!req.file) throw uploadFieldError('validation_failed', 400, 'photo', 'attach one JPEG, PNG or WebP file in the form field photo');
  return { bytes: req.file.buffer, originalName: cleanUploadFileName(req.file.originalname, 'photo'), findingId: form.findingId ?? null };
}
