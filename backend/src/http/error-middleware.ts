import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from './app-error';

/** Answers any /api path no router claimed, so clients never get the front end's HTML by mistake. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(AppError.notFound(`No API route for ${req.method} ${req.originalUrl.split('?')[0]}`));
};

/** Body-parser errors carry an HTTP status and a `type`; they are the client's fault, not ours. */
function fromBodyParser(error: unknown): AppError | null {
  if (typeof error !== 'object' || error === null || !('type' in error)) return null;
  const { type } = error as { type: unknown };
  if (type === 'entity.too.large') {
    return new AppError({ code: 'payload_too_large', status: 413, message: 'The request body is larger than this endpoint accepts' });
  }
  if (type === 'entity.parse.failed') {
    return new AppError({ code: 'malformed_body', status: 400, message: 'The request body is not valid JSON' });
  }
  return null;
}

/**
 * A unique key the database refused: two people adding the same thing at the same moment. The
 * services check first and name the field; this covers the race between the check and the write.
 */
function fromDatabase(error: unknown): AppError | null {
  if (typeof error !== 'object' || error === null || (error as { code?: unknown }).code !== '23505') return null;
  return new AppError({ code: 'already_exists', status: 409, message: 'Someone else has just added a record with the same key; reload and try again', cause: error });
}

/** The one place errors become responses: `{ error: { code, message, details }, requestId }`, never a stack. */
export const errorMiddleware: ErrorRequestHandler = (error: unknown, req, res, _next) => {
  const known = error instanceof AppError ? error : (fromBodyParser(error) ?? fromDatabase(error));
  const appError =
    known ?? new AppError({ code: 'internal_error', status: 500, message: 'Something went wrong on the server; quote the request id when reporting it' });
  if (known === null) req.log.error({ err: error }, 'unhandled error');
  else if (appError.status >= 500) req.log.error({ err: appError.cause ?? appError }, appError.message);
  else req.log.info({ code: appError.code }, appError.message);

  if (res.headersSent) return;
  res.status(appError.status).json({
    error: { code: appError.code, message: appError.message, details: appError.details },
    requestId: String(req.id),
  });
};
