import { HttpErrorResponse, type HttpInterceptorFn, type HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, from, switchMap, throwError } from 'rxjs';
import { loadContracts } from './contracts';
import { CsrfService } from './csrf-service';

export const CSRF_HEADER = 'x-csrf-token';
const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function isOwnApi(req: HttpRequest<unknown>): boolean {
  return req.url.startsWith('/api/');
}

/**
 * Adds the session's CSRF token to every state-changing API call. If the server says the token
 * is stale (403 `csrf_invalid`), fetch a fresh one and retry once.
 */
export const csrfInterceptor: HttpInterceptorFn = (req, next) => {
  if (!UNSAFE.has(req.method) || !isOwnApi(req)) return next(req);
  const csrf = inject(CsrfService);
  const send = () =>
    csrf
      .token()
      .pipe(switchMap((token) => next(req.clone({ setHeaders: { [CSRF_HEADER]: token } }))));
  return send().pipe(
    catchError((error: unknown) => {
      if (!(error instanceof HttpErrorResponse) || error.status !== 403)
        return throwError(() => error);
      return from(loadContracts()).pipe(
        switchMap(({ ProblemBody }) => {
          if (ProblemBody.safeParse(error.error).data?.error.code !== 'csrf_invalid') {
            return throwError(() => error);
          }
          csrf.reset();
          return send();
        }),
      );
    }),
  );
};
