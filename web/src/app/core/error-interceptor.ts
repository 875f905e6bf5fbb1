import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { HANDLED_STATUSES } from './api';

/**
 * One place for API errors: 401 sends the user to the sign-in page (keeping where they were),
 * anything else shows the server's message in a snackbar. Callers that show an error themselves
 * list its status in the `HANDLED_STATUSES` context.
 */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const router = inject(Router);
  const snackBar = inject(MatSnackBar);
  return next(req).pipe(
    catchError((error: unknown) => {
      if (
        error instanceof HttpErrorResponse &&
        !req.context.get(HANDLED_STATUSES).includes(error.status)
      ) {
        if (error.status === 401) {
          const current = router.url;
          const returnUrl = current.startsWith('/sign-in') || current === '/' ? null : current;
          void router.navigate(['/sign-in'], { queryParams: returnUrl ? { returnUrl } : {} });
        } else {
          void import('./problem').then(({ problemMessage }) =>
            snackBar.open(problemMessage(error), 'Close', {
              duration: 8000,
              politeness: 'assertive',
            }),
          );
        }
      }
      return throwError(() => error);
    }),
  );
};
