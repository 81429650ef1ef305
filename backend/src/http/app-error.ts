/** Error codes the API answers with; clients may branch on them, so keep them stable. */
export type ErrorCode =
  | 'validation_failed'
  | 'malformed_body'
  | 'payload_too_large'
  | 'not_found'
  | 'version_conflict'
  | 'already_exists'
  | 'read_only'
  | 'not_ratable'
  | 'not_approvable'
  | 'storage_unavailable'
  | 'unsupported_media_type'
  | 'sign_in_required'
  | 'forbidden'
  | 'xsrf_check_failed'
  | 'sign_in_failed'
  | 'database_unavailable'
  | 'internal_error';

export interface InvalidField {
  /** Dotted path of the field, e.g. `bbox` for a query parameter or `spans.0.lengthM` in a body. */
  readonly field: string;
  readonly message: string;
}

export interface AppErrorOptions {
  readonly code: ErrorCode;
  readonly status: number;
  /** Safe to show to the user: never holds SQL, paths or stack traces. */
  readonly message: string;
  readonly details?: unknown;
  /** The underlying failure, logged on the server and never sent to the client. */
  readonly cause?: unknown;
}

/** The one error type the server throws on purpose; the error middleware turns it into a response. */
export class AppError extends Error {
  readonly code: ErrorCode;
  readonly status: number;
  readonly details: unknown;

  constructor({ code, status, message, details, cause }: AppErrorOptions) {
    super(message, { cause });
    this.name = 'AppError';
    this.code = code;
    this.status = status;
    this.details = details ?? null;
  }

  /** 400 naming each bad field (`barriers.0.loadKnM`), the way every validation error of the API reads. */
  static invalidFields(fields: readonly InvalidField[], part = 'body field'): AppError {
    const summary = fields.map((f) => `${f.field}: ${f.message}`).join('; ');
    return new AppError({
      code: 'validation_failed',
      status: 400,
      message: `Invalid ${part}${fields.length > 1 ? 's' : ''}: ${summary}`,
      details: { fields },
    });
  }

  static notFound(message: string): AppError {
    return new AppError({ code: 'not_found', status: 404, message });
  }

  /** Someone changed the record after the client read it; `current` lets the client show what it is now. */
  static versionConflict(what: string, current: unknown): AppError {
    return new AppError({
      code: 'version_conflict',
      status: 409,
      message: `${what} was changed by someone else after you opened it; reload to see the current values, then make your change again`,
      details: { current },
    });
  }

  static alreadyExists(message: string, field: string): AppError {
    return new AppError({ code: 'already_exists', status: 409, message, details: { fields: [{ field, message }] } });
  }

  /** The record is past the state in which it may change (a submitted inspection, an approved rating). */
  static readOnly(message: string): AppError {
    return new AppError({ code: 'read_only', status: 409, message });
  }

  static signInRequired(): AppError {
    return new AppError({ code: 'sign_in_required', status: 401, message: 'Sign in to continue' });
  }

  static forbidden(message: string): AppError {
    return new AppError({ code: 'forbidden', status: 403, message });
  }
}
