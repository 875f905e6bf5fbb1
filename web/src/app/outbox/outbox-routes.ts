import type { Routes } from '@angular/router';

export const OUTBOX_ROUTES: Routes = [
  {
    path: '',
    title: 'Outbox · Ringlet',
    loadComponent: () => import('./outbox').then((m) => m.Outbox),
  },
];
