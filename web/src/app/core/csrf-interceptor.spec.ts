import { HttpClient } from '@angular/common/http';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { csrfInterceptor } from './csrf-interceptor';
import { httpTestBed, settle } from './testing';

describe('csrfInterceptor', () => {
  let client: HttpClient;
  let http: HttpTestingController;

  beforeEach(() => {
    http = httpTestBed([csrfInterceptor]);
    client = TestBed.inject(HttpClient);
  });

  afterEach(() => http.verify());

  it('fetches the token once and sends it on every POST, PATCH and DELETE', async () => {
    const first = firstValueFrom(client.post('/api/v1/admin/users', { name: 'A' }));
    const token = http.expectOne({ method: 'GET', url: '/api/v1/auth/csrf-token' });
    token.flush({ token: 'abc', headerName: 'x-csrf-token' });
    await settle();
    const post = http.expectOne({ method: 'POST', url: '/api/v1/admin/users' });
    expect(post.request.headers.get('x-csrf-token')).toBe('abc');
    post.flush({});
    await first;

    const second = firstValueFrom(client.patch('/api/v1/admin/users/1', {}));
    const third = firstValueFrom(client.delete('/api/v1/admin/memberships/1'));
    await settle();
    http.expectNone('/api/v1/auth/csrf-token');
    const patch = http.expectOne({ method: 'PATCH', url: '/api/v1/admin/users/1' });
    const del = http.expectOne({ method: 'DELETE', url: '/api/v1/admin/memberships/1' });
    expect(patch.request.headers.get('x-csrf-token')).toBe('abc');
    expect(del.request.headers.get('x-csrf-token')).toBe('abc');
    patch.flush({});
    del.flush(null);
    await Promise.all([second, third]);
  });

  it('leaves GET requests alone', async () => {
    const get = firstValueFrom(client.get('/api/v1/admin/users'));
    const req = http.expectOne('/api/v1/admin/users');
    expect(req.request.headers.has('x-csrf-token')).toBe(false);
    req.flush([]);
    await get;
  });

  it('re-fetches the token and retries once on 403 csrf_invalid', async () => {
    const done = firstValueFrom(client.post('/api/v1/auth/sign-out', null));
    http.expectOne('/api/v1/auth/csrf-token').flush({ token: 'old', headerName: 'x-csrf-token' });
    await settle();
    http
      .expectOne('/api/v1/auth/sign-out')
      .flush(
        { error: { code: 'csrf_invalid', message: 'Stale token.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await settle();
    http.expectOne('/api/v1/auth/csrf-token').flush({ token: 'new', headerName: 'x-csrf-token' });
    await settle();
    const retry = http.expectOne('/api/v1/auth/sign-out');
    expect(retry.request.headers.get('x-csrf-token')).toBe('new');
    retry.flush(null, { status: 204, statusText: 'No Content' });
    await expect(done).resolves.toBeNull();
  });

  it('does not retry other 403 errors', async () => {
    const done = firstValueFrom(client.post('/api/v1/admin/users', {}));
    http.expectOne('/api/v1/auth/csrf-token').flush({ token: 'abc', headerName: 'x-csrf-token' });
    await settle();
    http
      .expectOne('/api/v1/admin/users')
      .flush(
        { error: { code: 'forbidden', message: 'Admins only.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await expect(done).rejects.toMatchObject({ status: 403 });
    await settle();
    http.expectNone('/api/v1/auth/csrf-token');
  });
});
