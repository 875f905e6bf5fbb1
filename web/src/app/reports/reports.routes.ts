import type { Routes } from '@angular/router';

export const REPORTS_ROUTES: Routes = [
  { path: '', title: 'Assessor · Ringlet', loadComponent: () => import('./assessor-home').then((m) => m.AssessorHome) },
];
