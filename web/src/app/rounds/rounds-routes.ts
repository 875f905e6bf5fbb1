import type { Routes } from '@angular/router';

export const ROUNDS_ROUTES: Routes = [
  {
    path: '',
    title: 'Round desk · Ringlet',
    loadComponent: () => import('./round-desk').then((m) => m.RoundDesk),
  },
  {
    path: 'rounds/:id',
    title: 'Round · Round desk · Ringlet',
    loadComponent: () => import('./round-detail/round-detail').then((m) => m.RoundDetail),
  },
  {
    path: 'rounds/:id/precision',
    loadChildren: () => import('../precision/precision-routes').then((m) => m.PRECISION_ROUTES),
  },
];
