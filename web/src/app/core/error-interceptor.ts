import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { Injector, inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { HANDLED_STATUSES } from './api';
import { openSnackBar } from './snack-bar';

/**
 * One place for API errors: 401 sends the user to the sign-in page (keeping where they were),
 * anything else shows the server's message in a snackbar. Callers that show an error themselves
 * list its status in the `HANDLED_STATUSES` context.
 */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const router = inject(Router);
  const injector = inject(Injector);
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
            openSnackBar(injector, problemMessage(error), {
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
