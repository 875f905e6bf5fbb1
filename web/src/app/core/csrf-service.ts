import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, catchError, from, shareReplay, switchMap, throwError } from 'rxjs';
import { API } from './api';
import { loadContracts } from './contracts';

/** Fetches the session's CSRF token once and keeps it until the session changes. */
@Injectable({ providedIn: 'root' })
export class CsrfService {
  private readonly http = inject(HttpClient);
  private cached: Observable<string> | null = null;

  /** The current token (fetched on first use, then shared). */
  token(): Observable<string> {
    if (!this.cached) {
      const attempt: Observable<string> = this.http.get<unknown>(`${API}/auth/csrf-token`).pipe(
        switchMap((body) =>
          from(loadContracts().then((c) => c.CsrfTokenResponse.parse(body).token)),
        ),
        catchError((error: unknown) => {
          // A failed fetch is not cached: the next call tries again.
          if (this.cached === attempt) this.cached = null;
          return throwError(() => error);
        }),
        shareReplay({ bufferSize: 1, refCount: false }),
      );
      this.cached = attempt;
    }
    return this.cached;
  }

  /** Forget the token (after sign-in or sign-out the server issues a new session and token). */
  reset(): void {
    this.cached = null;
  }
}
