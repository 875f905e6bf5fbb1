import { HttpClient, HttpContext, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { type Observable, firstValueFrom, from, map, switchMap, tap } from 'rxjs';
import type {
  Me,
  PasswordTokenInfo,
  Role,
  SetPasswordRequest,
  SignInRequest,
} from '@ringlet/shared/contracts/auth';
import { API, HANDLED_STATUSES } from './api';
import { loadContracts } from './contracts';
import { CsrfService } from './csrf-service';

const handled = (...statuses: number[]) => new HttpContext().set(HANDLED_STATUSES, statuses);

/** The signed-in user (or nobody), and the calls that change it. */
@Injectable({ providedIn: 'root' })
export class AuthService {
  private readonly http = inject(HttpClient);
  private readonly csrf = inject(CsrfService);
  private readonly current = signal<Me | null>(null);
  private loading: Promise<Me | null> | null = null;

  /** The signed-in user, or null. */
  readonly me = this.current.asReadonly();
  /** Every role the user can act in (empty when signed out). */
  readonly roles = computed<readonly Role[]>(() => this.current()?.roles ?? []);
  readonly isSignedIn = computed(() => this.current() !== null);
  /** Labs this user manages (lab manager pages). */
  readonly managedLabs = computed(
    () => this.current()?.memberships.filter((membership) => membership.isManager) ?? [],
  );

  /**
   * The lab this session acts for: the one chosen (kept in the server's session), or the only lab;
   * null for a person in several labs who has not chosen yet.
   */
  readonly actingLabId = computed(() => this.current()?.actingLabId ?? null);

  hasRole(role: Role): boolean {
    return this.roles().includes(role);
  }

  /** GET /auth/me: who is signed in (null on 401). Always asks the server. */
  load(): Promise<Me | null> {
    const request = firstValueFrom(
      this.http.get<unknown>(`${API}/auth/me`, { context: handled(401) }),
    ).then(
      async (body) => {
        const me = (await loadContracts()).Me.parse(body);
        this.current.set(me);
        return me;
      },
      (error: unknown) => {
        if (error instanceof HttpErrorResponse && error.status === 401) {
          this.current.set(null);
          return null;
        }
        this.loading = null;
        throw error;
      },
    );
    this.loading = request;
    return request;
  }

  /** The session as loaded once per page load (guards wait on this). */
  ensureLoaded(): Promise<Me | null> {
    return this.loading ?? this.load();
  }

  /** POST /auth/sign-in. The caller shows 400/401/429 itself. */
  signIn(request: SignInRequest): Observable<Me> {
    return this.http
      .post<unknown>(`${API}/auth/sign-in`, request, { context: handled(400, 401, 429) })
      .pipe(
        switchMap((body) =>
          from(loadContracts()).pipe(map((c) => c.SignInResponse.parse(body).user)),
        ),
        tap((me) => {
          // The server regenerated the session: the old CSRF token went with it.
          this.csrf.reset();
          this.current.set(me);
          this.loading = Promise.resolve(me);
        }),
      );
  }

  /** POST /auth/sign-out; the local state is cleared even if the server call fails. */
  signOut(): Observable<void> {
    const clear = () => {
      this.csrf.reset();
      this.current.set(null);
      this.loading = Promise.resolve(null);
    };
    return this.http.post(`${API}/auth/sign-out`, null, { context: handled(401) }).pipe(
      map(() => undefined),
      tap({ next: clear, error: clear }),
    );
  }

  /**
   * PUT /auth/acting-lab: a person in several labs chooses the lab they act for. The server keeps
   * the choice in the session; the page shows the new lab at once.
   */
  chooseLab(labId: string): Observable<Me> {
    const me = this.current();
    if (me) this.current.set({ ...me, actingLabId: labId });
    return this.http.put<unknown>(`${API}/auth/acting-lab`, { labId }).pipe(
      switchMap((body) => from(loadContracts()).pipe(map((c) => c.Me.parse(body)))),
      tap({
        next: (updated) => this.current.set(updated),
        error: () => this.current.set(me),
      }),
    );
  }

  /** Takes the account as the server answered it (after accepting a lab invitation). */
  setMe(me: Me): void {
    this.current.set(me);
    this.loading = Promise.resolve(me);
  }

  /** POST /auth/password/change: other sessions of the account end; this one stays. */
  changePassword(request: { currentPassword: string; password: string }): Observable<void> {
    return this.http
      .post(`${API}/auth/password/change`, request, { context: handled(400, 422, 429) })
      .pipe(map(() => undefined));
  }

  /** POST /auth/password-reset: always answers 202 (no user enumeration). */
  requestPasswordReset(email: string): Observable<void> {
    return this.http
      .post(`${API}/auth/password-reset`, { email }, { context: handled(400, 429) })
      .pipe(map(() => undefined));
  }

  /** GET /auth/password-tokens/{token}: whose password the e-mailed link sets (404 when unusable). */
  passwordTokenInfo(token: string): Observable<PasswordTokenInfo> {
    return this.http
      .get<unknown>(`${API}/auth/password-tokens/${encodeURIComponent(token)}`, {
        context: handled(400, 404),
      })
      .pipe(
        switchMap((body) =>
          from(loadContracts()).pipe(map((c) => c.PasswordTokenInfo.parse(body))),
        ),
      );
  }

  /** POST /auth/password: set a first password or a new one with the e-mailed token. */
  setPassword(request: SetPasswordRequest): Observable<void> {
    return this.http
      .post(`${API}/auth/password`, request, { context: handled(400, 404, 410) })
      .pipe(map(() => undefined));
  }
}
