import { HttpClient, HttpParams } from '@angular/common/http';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { EARLY_GLOBAL } from '../../early/early-calls';
import { dropEarlyResponses, earlyResponseInterceptor } from './early-responses';
import { settle, httpTestBed } from './testing';

/** jsdom has no Response: the members the interceptor reads. */
function answer(status: number, body: string): Promise<Response> {
  return Promise.resolve({
    ok: status >= 200 && status < 300,
    status,
    statusText: '',
    url: '',
    headers: { get: () => 'application/json' },
    text: () => Promise.resolve(body),
  } as unknown as Response);
}

describe('earlyResponseInterceptor', () => {
  let client: HttpClient;
  let http: HttpTestingController;
  const early = new Map<string, Promise<Response>>();

  beforeEach(() => {
    (globalThis as unknown as Record<string, unknown>)[EARLY_GLOBAL] = early;
    early.clear();
    http = httpTestBed([earlyResponseInterceptor]);
    client = TestBed.inject(HttpClient);
  });

  afterEach(() => http.verify());

  it('answers the first GET of the same URL (with its query) from the early call, once', async () => {
    early.set('/api/v1/my/rounds/r1?labId=l1', answer(200, '{"code":"R1"}'));
    const params = new HttpParams().set('labId', 'l1');
    expect(await firstValueFrom(client.get('/api/v1/my/rounds/r1', { params }))).toEqual({
      code: 'R1',
    });
    http.expectNone('/api/v1/my/rounds/r1?labId=l1');
    const again = firstValueFrom(client.get('/api/v1/my/rounds/r1', { params }));
    await settle();
    http.expectOne('/api/v1/my/rounds/r1?labId=l1').flush({ code: 'R1 again' });
    expect(await again).toEqual({ code: 'R1 again' });
  });

  it('asks the server itself when the early call was refused or failed', async () => {
    early.set('/api/v1/auth/me', answer(401, '{}'));
    early.set('/api/v1/health', Promise.reject(new Error('offline')));
    const me = firstValueFrom(client.get('/api/v1/auth/me'));
    const health = firstValueFrom(client.get('/api/v1/health'));
    await settle();
    http.expectOne('/api/v1/auth/me').flush({ id: 'u1' });
    http.expectOne('/api/v1/health').flush({ mode: 'demo' });
    expect(await me).toEqual({ id: 'u1' });
    expect(await health).toEqual({ mode: 'demo' });
  });

  it('never answers a later call once the first page dropped what it left', async () => {
    early.set('/api/v1/rounds/r1/board', answer(200, '{"rows":[]}'));
    dropEarlyResponses();
    const board = firstValueFrom(client.get('/api/v1/rounds/r1/board'));
    await settle();
    http.expectOne('/api/v1/rounds/r1/board').flush({ rows: [1] });
    expect(await board).toEqual({ rows: [1] });
  });
});
