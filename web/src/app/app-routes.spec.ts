import { UrlSegment } from '@angular/router';
import { AUTH_ROUTES } from './auth/auth-routes';
import { AUTH_PAGES, authPagesMatcher, opensSignedInArea, routes } from './app-routes';

const segments = (path: string) =>
  path
    .split('/')
    .filter((s) => s !== '')
    .map((s) => new UrlSegment(s, {}));

describe('top-level routes', () => {
  it('send every page of the auth routes, and only those, to the auth chunk', () => {
    const firstSegments = new Set(AUTH_ROUTES.map((r) => r.path!.split('/')[0]!));
    expect([...firstSegments].sort()).toEqual([...AUTH_PAGES].sort());
    for (const r of AUTH_ROUTES) {
      expect(authPagesMatcher(segments(r.path!.replace(':token', 'abc')))).toEqual({
        consumed: [],
      });
    }
    for (const path of ['/', '/board/rounds/7', '/bench', '/invitations/abc', '/nowhere'])
      expect(authPagesMatcher(segments(path))).toBeNull();
    // No other top-level route claims an auth page's first segment.
    const others = routes.filter((r) => r.path !== undefined).map((r) => r.path!.split('/')[0]);
    for (const page of AUTH_PAGES) expect(others).not.toContain(page);
  });

  it('ask who is signed in early only on pages behind a guard', () => {
    for (const path of ['/', '/board/rounds/7', '/bench/rounds/1', '/desk', '/admin/users'])
      expect(opensSignedInArea(path)).toBe(true);
    for (const path of ['/sign-in', '/set-password/abc', '/invitations/abc', '/nowhere'])
      expect(opensSignedInArea(path)).toBe(false);
  });
});
