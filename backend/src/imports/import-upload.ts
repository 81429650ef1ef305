import { createHash } from 'node:crypto';
import { createReadStream, mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Request, RequestHandler } from 'express';
import multer, { MulterError } from 'multer';
import { z } from 'zod';
import { IMPORT_TEMPLATE_NAMES } from '../../../shared/src';
import { AppError } from '../http/app-error';
import { cleanUploadFileName, megabytes } from '../http/uploads';
import { parseRequest } from '../http/validate';

/** Where uploads wait while they are checked; each is removed when its request ends. */
const UPLOAD_FOLDER = path.join(tmpdir(), 'spanledger-imports');

/** The form's text fields: the template of a CSV file (an XLSX names its templates by its sheets). */
const uploadForm = z.strictObject({
  template: z.preprocess((value) => (value === '' ? undefined : value), z.enum(IMPORT_TEMPLATE_NAMES).optional()),
});

function uploadError(error: unknown, sizeLimitBytes: number): AppError {
  if (!(error instanceof MulterError)) {
    return new AppError({ code: 'malformed_body', status: 400, message: 'The request body is not a readable multipart/form-data form', cause: error });
  }
  if (error.code === 'LIMIT_FILE_SIZE') {
    return new AppError({
      code: 'payload_too_large',
      status: 413,
      message: `The file is larger than the ${megabytes(sizeLimitBytes)} (${sizeLimitBytes} bytes) an import may have; split it into smaller files`,
      details: { fields: [{ field: 'file', message: `larger than ${sizeLimitBytes} bytes` }] },
    });
  }
  if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
    return AppError.invalidFields([{ field: error.field ?? 'file', message: 'send one file, in the field file' }]);
  }
  return AppError.invalidFields([{ field: error.field ?? '(root)', message: `the form has more than it may carry (${error.message.toLowerCase()})` }]);
}

/**
 * Receives one spreadsheet in the multipart field `file` onto the server's disk, cut off as soon
 * as it passes the size limit, so a large file never sits whole in memory.
 */
export function receiveImportFile(sizeLimitBytes: number): RequestHandler {
  mkdirSync(UPLOAD_FOLDER, { recursive: true });
  const upload = multer({
    storage: multer.diskStorage({ destination: UPLOAD_FOLDER }),
    limits: { fileSize: sizeLimitBytes, files: 1, fields: 2, fieldSize: 64, parts: 3 },
    defParamCharset: 'utf8',
  }).single('file');
  return (req, res, next) => {
    upload(req, res, (error?: unknown) => {
      if (error && req.file) void rm(req.file.path, { force: true });
      next(error ? uploadError(error, sizeLimitBytes) : undefined);
    });
  };
}

export interface ReceivedImportFile {
  readonly filePath: string;
  readonly fileName: string;
  readonly byteSize: number;
  readonly template: (typeof IMPORT_TEMPLATE_NAMES)[number] | null;
}

/** The file `receiveImportFile` wrote; 400 naming `file` when none came. */
export function receivedImportFile(req: Request): ReceivedImportFile {
  const { template } = parseRequest(uploadForm, req.body ?? {}, 'body field');
  if (!req.file) throw AppError.invalidFields([{ field: 'file', message: 'choose a CSV or XLSX file to import' }]);
  return { filePath: req.file.path, fileName: cleanUploadFileName(req.file.originalname, 'upload'), byteSize: req.file.size, template: template ?? null };
}

/** Removes the upload's temporary file; nothing else refers to it. */
export async function removeReceivedFile(file: Pick<ReceivedImportFile, 'filePath'>): Promise<void> {
  await rm(file.filePath, { force: true });
}

/** SHA-256 of the file's bytes, read as a stream: the same file twice is recognised by it. */
export async function contentSha256(filePath: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(filePath)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}
