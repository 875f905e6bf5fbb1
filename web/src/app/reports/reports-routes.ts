import type { Routes } from '@angular/router';

export const REPORTS_ROUTES: Routes = [
  {
    path: '',
    title: 'Assessor · Ringlet',
    loadComponent: () => import('./assessor-home').then((m) => m.AssessorHome),
  },
  {
    path: 'labs/:id',
    title: 'Lab · Assessor · Ringlet',
    loadComponent: () => import('./assessor-lab').then((m) => m.AssessorLab),
  },
];
