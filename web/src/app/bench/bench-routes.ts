import type { Routes } from '@angular/router';

export const BENCH_ROUTES: Routes = [
  {
    path: '',
    title: 'Lab bench · Ringlet',
    loadComponent: () => import('./lab-bench').then((m) => m.LabBench),
  },
  {
    path: 'rounds/:id',
    title: 'Round · Lab bench · Ringlet',
    loadComponent: () => import('./bench-round/bench-round').then((m) => m.BenchRound),
  },
  {
    path: 'track-record',
    title: 'Track record · Ringlet',
    loadComponent: () => import('./track-record').then((m) => m.TrackRecord),
  },
];
