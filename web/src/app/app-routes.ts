import type { Routes } from '@angular/router';
import {
  authGuard,
  homeRedirectGuard,
  labManagerGuard,
  outboxGuard,
  roleGuard,
} from './core/auth-guards';

export const routes: Routes = [
  { path: '', pathMatch: 'full', canActivate: [homeRedirectGuard], children: [] },
  { path: '', loadChildren: () => import('./auth/auth-routes').then((m) => m.AUTH_ROUTES) },
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
