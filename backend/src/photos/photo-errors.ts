import { AppError, type ErrorCode } from '../http/app-error';

/** A refusal naming one field of the upload form, shaped like every other field error of the API. */
export function uploadFieldError(code: ErrorCode, status: number, field: string, message: string): AppError {
  return new AppError({ code, status, message: `${field}: ${message}`, details: { fields: [{ field, message }] } });
}

/** 415: the file in `photo` is not a JPEG, PNG or WebP image that can be read. */
export function unsupportedPhoto(message: string): AppError {
  return uploadFieldError('unsupported_media_type', 415, 'photo', message);
}

/** 413: the file in `photo` is bigger than the server accepts. */
export function photoTooLarge(message: string): AppError {
  return uploadFieldError('payload_too_large', 413, 'photo', message);
}
