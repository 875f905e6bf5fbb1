import type { Routes, UrlMatchResult, UrlSegment } from '@angular/router';
import {
  authGuard,
  homeRedirectGuard,
  labManagerGuard,
  outboxGuard,
  roleGuard,
} from './core/auth-guards';

/**
 * First path segments of the pages in auth/auth-routes.ts (checked by app-routes.spec.ts). The
 * auth routes match only these, so opening any other page does not wait for the auth chunk to
 * load just to learn that none of its routes match.
 */
export const AUTH_PAGES: ReadonlySet<string> = new Set([
  'sign-in',
  'forgot-password',
  'set-password',
  'account',
  'lab-invitations',
]);

export function authPagesMatcher(segments: UrlSegment[]): UrlMatchResult | null {
  return segments.length > 0 && AUTH_PAGES.has(segments[0]!.path) ? { consumed: [] } : null;
}

export const routes: Routes = [
  { path: '', pathMatch: 'full', canActivate: [homeRedirectGuard], children: [] },
  {
    matcher: authPagesMatcher,
    loadChildren: () => import('./auth/auth-routes').then((m) => m.AUTH_ROUTES),
  },
  {
    path: 'desk',
    canActivate: [authGuard, roleGuard('coordinator')],
    loadChildren: () => import('./rounds/rounds-routes').then((m) => m.ROUNDS_ROUTES),
  },
  {
    path: 'bench/lab-members',
    canActivate: [authGuard, labManagerGuard],
    loadChildren: () =>
      import('./bench/lab-members/lab-members-routes').then((m) => m.LAB_MEMBERS_ROUTES),
  },
  {
    path: 'bench',
    canActivate: [authGuard, roleGuard('lab')],
    loadChildren: () => import('./bench/bench-routes').then((m) => m.BENCH_ROUTES),
  },
  {
    path: 'assessor',
    canActivate: [authGuard, roleGuard('assessor')],
    loadChildren: () => import('./reports/reports-routes').then((m) => m.REPORTS_ROUTES),
  },
  {
    path: 'admin',
    canActivate: [authGuard, roleGuard('admin')],
    loadChildren: () => import('./admin/admin-routes').then((m) => m.ADMIN_ROUTES),
  },
  {
    path: 'provider',
    canActivate: [authGuard],
    loadChildren: () => import('./provider/provider-routes').then((m) => m.PROVIDER_ROUTES),
  },
  {
    path: 'billing',
    canActivate: [authGuard],
    loadChildren: () => import('./billing/billing-routes').then((m) => m.BILLING_ROUTES),
  },
  {
    path: 'outbox',
    canActivate: [authGuard, outboxGuard],
    loadChildren: () => import('./outbox/outbox-routes').then((m) => m.OUTBOX_ROUTES),
  },
  {
    path: 'invitations/:token',
    title: 'Invitation · Ringlet',
    loadComponent: () => import('./rounds/accept-invitation').then((m) => m.AcceptInvitation),
  },
  {
    path: 'board',
    canActivate: [authGuard],
    loadChildren: () => import('./board/board-routes').then((m) => m.BOARD_ROUTES),
  },
  {
    path: 'no-role',
    canActivate: [authGuard],
    title: 'No role · Ringlet',
    loadComponent: () => import('./core/no-role').then((m) => m.NoRole),
  },
  {
    path: '**',
    title: 'Not found · Ringlet',
    loadComponent: () => import('./core/not-found').then((m) => m.NotFound),
  },
];

/**
 * Whether opening `pathname` goes through a guard that asks who is signed in (a top-level route
 * with a guard, or `/`): the shell then asks at once, in parallel with loading the page's code.
 * Public pages (sign-in, invitations, not found) are never asked for, so a signed-out visitor
 * sees no 401.
 */
export function opensSignedInArea(pathname: string): boolean {
  const first = pathname.split('/').find((s) => s !== '') ?? '';
  return routes.some(
    (r) =>
      (r.canActivate?.length ?? 0) > 0 && r.path !== undefined && r.path.split('/')[0] === first,
  );
}
