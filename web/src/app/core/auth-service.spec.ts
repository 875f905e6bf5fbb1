import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { AuthService } from './auth-service';
import { csrfInterceptor } from './csrf-interceptor';
import { CsrfService } from './csrf-service';
import { aMe, httpTestBed, settle } from './testing';

describe('AuthService', () => {
  let auth: AuthService;
  let http: HttpTestingController;

  beforeEach(() => {
    http = httpTestBed([csrfInterceptor]);
    auth = TestBed.inject(AuthService);
  });

  afterEach(() => http.verify());

  it('load() asks GET /api/v1/auth/me and exposes me and roles as signals', async () => {
    const loaded = auth.load();
    http
      .expectOne({ method: 'GET', url: '/api/v1/auth/me' })
      .flush(aMe({ roles: ['lab', 'assessor'] }));
    await expect(loaded).resolves.toMatchObject({ name: 'Mira Okafor' });
    expect(auth.me()?.email).toBe('mira.okafor@example.test');
    expect(auth.roles()).toEqual(['lab', 'assessor']);
    expect(auth.isSignedIn()).toBe(true);
  });

  it('load() resolves null on 401 (nobody signed in)', async () => {
    const loaded = auth.load();
    http
      .expectOne('/api/v1/auth/me')
      .flush(
        { error: { code: 'unauthenticated', message: 'Sign in.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await expect(loaded).resolves.toBeNull();
    expect(auth.me()).toBeNull();
    expect(auth.roles()).toEqual([]);
  });

  it('load() rejects a response that does not match the Me contract', async () => {
    const loaded = auth.load();
    http.expectOne('/api/v1/auth/me').flush({ id: 'not-a-uuid', name: 'x' });
    await expect(loaded).rejects.toBeTruthy();
    expect(auth.me()).toBeNull();
  });

  it('signIn() posts with the CSRF header, stores the user and forgets the old token', async () => {
    const csrf = TestBed.inject(CsrfService);
    const reset = jest.spyOn(csrf, 'reset');
    const signedIn = firstValueFrom(
      auth.signIn({ email: 'mira.okafor@example.test', password: 'long enough pw' }),
    );
    http.expectOne('/api/v1/auth/csrf-token').flush({ token: 't-1', headerName: 'x-csrf-token' });
    await settle();
    const post = http.expectOne({ method: 'POST', url: '/api/v1/auth/sign-in' });
    expect(post.request.headers.get('x-csrf-token')).toBe('t-1');
    expect(post.request.body).toEqual({
      email: 'mira.okafor@example.test',
      password: 'long enough pw',
    });
    post.flush({ user: aMe({ roles: ['admin'] }) });
    await expect(signedIn).resolves.toMatchObject({ roles: ['admin'] });
    expect(auth.roles()).toEqual(['admin']);
    expect(reset).toHaveBeenCalled();
    await expect(auth.ensureLoaded()).resolves.toMatchObject({ roles: ['admin'] });
  });

  it('signOut() clears the user even when the server fails', async () => {
    const loaded = auth.load();
    http.expectOne('/api/v1/auth/me').flush(aMe());
    await loaded;
    const out = firstValueFrom(auth.signOut());
    http.expectOne('/api/v1/auth/csrf-token').flush({ token: 't-2', headerName: 'x-csrf-token' });
    await settle();
    http
      .expectOne('/api/v1/auth/sign-out')
      .flush(null, { status: 500, statusText: 'Server Error' });
    await expect(out).rejects.toBeTruthy();
    expect(auth.me()).toBeNull();
  });
});
