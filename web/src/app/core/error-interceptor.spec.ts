import { HttpClient, HttpContext } from '@angular/common/http';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { HANDLED_STATUSES } from './api';
import { errorInterceptor } from './error-interceptor';
import { httpTestBed, settle } from './testing';

describe('errorInterceptor', () => {
  let client: HttpClient;
  let http: HttpTestingController;
  let router: Router;
  let open: jest.SpyInstance;

  beforeEach(() => {
    http = httpTestBed([errorInterceptor], [provideRouter([])]);
    client = TestBed.inject(HttpClient);
    router = TestBed.inject(Router);
    open = jest.spyOn(TestBed.inject(MatSnackBar), 'open').mockReturnValue(undefined as never);
  });

  afterEach(() => http.verify());

  it('sends the user to /sign-in on 401, keeping where they were', async () => {
    jest.spyOn(router, 'url', 'get').mockReturnValue('/admin/users');
    const navigate = jest.spyOn(router, 'navigate').mockResolvedValue(true);
    const call = firstValueFrom(client.get('/api/v1/admin/users'));
    http.expectOne('/api/v1/admin/users').flush(null, { status: 401, statusText: 'Unauthorized' });
    await expect(call).rejects.toMatchObject({ status: 401 });
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], {
      queryParams: { returnUrl: '/admin/users' },
    });
    expect(open).not.toHaveBeenCalled();
  });

  it("shows the server's message in a snackbar for other errors", async () => {
    const call = firstValueFrom(client.post('/api/v1/admin/organisations', {}));
    http
      .expectOne('/api/v1/admin/organisations')
      .flush(
        { error: { code: 'conflict', message: 'A lab with this name exists.' } },
        { status: 409, statusText: 'Conflict' },
      );
    await expect(call).rejects.toMatchObject({ status: 409 });
    await settle();
    expect(open).toHaveBeenCalledWith('A lab with this name exists.', 'Close', expect.any(Object));
  });

  it('stays quiet for statuses the caller handles itself', async () => {
    const navigate = jest.spyOn(router, 'navigate');
    const context = new HttpContext().set(HANDLED_STATUSES, [401]);
    const call = firstValueFrom(client.get('/api/v1/auth/me', { context }));
    http.expectOne('/api/v1/auth/me').flush(null, { status: 401, statusText: 'Unauthorized' });
    await expect(call).rejects.toMatchObject({ status: 401 });
    await settle();
    expect(navigate).not.toHaveBeenCalled();
    expect(open).not.toHaveBeenCalled();
  });
});
