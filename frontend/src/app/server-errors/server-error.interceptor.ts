import { HttpContextToken, HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { catchError, throwError } from 'rxjs';

import { describeServerError, serverErrorReport } from './server-error';

const SNACK_BAR_DURATION_MS = 8000;

/**
 * Set on a request the app makes by itself in the background (such as polling for alerts): its
 * failure is not the user's doing, so it shows no snack bar; the caller still sees the error.
 */
export const QUIET_ON_FAILURE = new HttpContextToken<boolean>(() => false);

/** Tells the user about every failed request in a snack bar, then lets the caller handle it too. */
export const serverErrorInterceptor: HttpInterceptorFn = (request, next) => {
  const snackBar = inject(MatSnackBar);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (error instanceof HttpErrorResponse && !request.context.get(QUIET_ON_FAILURE)) {
        snackBar.open(describeServerError(serverErrorReport(error)), 'Dismiss', { duration: SNACK_BAR_DURATION_MS });
      }
      return throwError(() => error);
    }),
  );
};
