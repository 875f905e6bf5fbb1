import type { Routes } from '@angular/router';

export const ADMIN_ROUTES: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'users' },
  {
    path: 'users',
    title: 'Users · Ringlet',
    loadComponent: () => import('./users').then((m) => m.Users),
  },
  {
    path: 'labs',
    title: 'Organisations · Ringlet',
    loadComponent: () => import('./labs').then((m) => m.Labs),
  },
  {
    path: 'labs/:id',
    title: 'Lab members · Ringlet',
    loadComponent: () => import('./lab-memberships').then((m) => m.LabMemberships),
  },
];
