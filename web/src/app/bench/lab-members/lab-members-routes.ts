import type { Routes } from '@angular/router';

export const LAB_MEMBERS_ROUTES: Routes = [
  {
    path: '',
    title: 'My lab · Ringlet',
    loadComponent: () => import('./lab-members').then((m) => m.LabMembers),
  },
];
