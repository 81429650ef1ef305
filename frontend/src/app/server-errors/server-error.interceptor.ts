import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { catchError, throwError } from 'rxjs';

import { describeServerError, serverErrorReport } from './server-error';

const SNACK_BAR_DURATION_MS = 8000;

/** Tells the user about every failed request in a snack bar, then lets the caller handle it too. */
export const serverErrorInterceptor: HttpInterceptorFn = (request, next) => {
  const snackBar = inject(MatSnackBar);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (error instanceof HttpErrorResponse) {
        snackBar.open(describeServerError(serverErrorReport(error)), 'Dismiss', { duration: SNACK_BAR_DURATION_MS });
      }
      return throwError(() => error);
    }),
  );
};
