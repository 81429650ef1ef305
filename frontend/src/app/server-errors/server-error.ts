import { HttpErrorResponse } from '@angular/common/http';

/** What the user is told about a failed request. */
export interface ServerErrorReport {
  readonly message: string;
  /** The server's id for the request, for quoting to support; null when the server sent none. */
  readonly requestId: string | null;
}

/** The body the server sends with every error: `{ error: { code, message, details }, requestId }`. */
interface ServerErrorBody {
  readonly error: { readonly code: string; readonly message: string; readonly details?: unknown };
  readonly requestId?: string;
}

function isServerErrorBody(body: unknown): body is ServerErrorBody {
  if (typeof body !== 'object' || body === null || !('error' in body)) return false;
  const error = (body as { error: unknown }).error;
  return typeof error === 'object' && error !== null && typeof (error as { message?: unknown }).message === 'string';
}

/** Reads the server's message and request id from a failed response, with a plain fallback. */
export function serverErrorReport(response: HttpErrorResponse): ServerErrorReport {
  if (isServerErrorBody(response.error)) {
    return { message: response.error.error.message, requestId: response.error.requestId ?? null };
  }
  if (response.status === 0) {
    return { message: 'The server could not be reached. Check your connection and try again.', requestId: null };
  }
  return { message: `The request failed with status ${response.status}.`, requestId: null };
}

/** One line for a snack bar or a panel: the message, then the request id when there is one. */
export function describeServerError(report: ServerErrorReport): string {
  return report.requestId ? `${report.message} (request ${report.requestId})` : report.message;
}
