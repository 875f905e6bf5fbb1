import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import {
  type ActivatedRouteSnapshot,
  type CanActivateFn,
  provideRouter,
  type RouterStateSnapshot,
  UrlTree,
} from '@angular/router';
import type { Me } from '@ringlet/shared/contracts/auth';
import { authGuard, homeRedirectGuard, labManagerGuard, roleGuard } from './auth-guards';
import { aLabMember, aMe, httpTestBed, settle } from './testing';

describe('auth guards', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = httpTestBed([], [provideRouter([])]);
  });

  afterEach(() => http.verify());

  async function run(guard: CanActivateFn, url: string, me: Me | null): Promise<unknown> {
    const result = TestBed.runInInjectionContext(() =>
      guard({} as ActivatedRouteSnapshot, { url } as RouterStateSnapshot),
    ) as Promise<unknown>;
    await settle();
    const req = http.expectOne('/api/v1/auth/me');
    if (me) req.flush(me);
    else req.flush(null, { status: 401, statusText: 'Unauthorized' });
    return result;
  }

  const asUrl = (value: unknown) => (value instanceof UrlTree ? value.toString() : value);

  it('authGuard lets a signed-in user through', async () => {
    expect(await run(authGuard, '/desk', aMe())).toBe(true);
  });

  it('authGuard sends a signed-out visitor to /sign-in with the return address', async () => {
    expect(asUrl(await run(authGuard, '/admin/users', null))).toBe(
      '/sign-in?returnUrl=%2Fadmin%2Fusers',
    );
  });

  it('roleGuard lets the role through and sends others to their own home', async () => {
    expect(await run(roleGuard('coordinator'), '/desk', aMe({ roles: ['coordinator'] }))).toBe(
      true,
    );
    TestBed.resetTestingModule();
    http = httpTestBed([], [provideRouter([])]);
    expect(asUrl(await run(roleGuard('admin'), '/admin/users', aMe({ roles: ['lab'] })))).toBe(
      '/bench',
    );
  });

  it('roleGuard sends a user without any role to /no-role', async () => {
    expect(asUrl(await run(roleGuard('assessor'), '/assessor', aMe({ roles: [] })))).toBe(
      '/no-role',
    );
  });

  it('labManagerGuard needs a managed lab', async () => {
    const member = aLabMember(false);
    expect(asUrl(await run(labManagerGuard, '/bench/lab-members', member))).toBe('/bench');
  });

  it('homeRedirectGuard sends / to the role home', async () => {
    expect(asUrl(await run(homeRedirectGuard, '/', aMe({ roles: ['assessor'] })))).toBe(
      '/assessor',
    );
  });
});
