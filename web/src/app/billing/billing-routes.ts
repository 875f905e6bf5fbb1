import { inject } from '@angular/core';
import { Router, type CanActivateFn, type Routes } from '@angular/router';
import { AuthService } from '../core/auth-service';

const hasRole =
  (role: 'lab' | 'coordinator'): CanActivateFn =>
  async () => {
    const me = await inject(AuthService).ensureLoaded();
    if (me?.roles.includes(role)) return true;
    return inject(Router).parseUrl('/');
  };

export const BILLING_ROUTES: Routes = [
  {
    path: '',
    title: 'Invoices · Ringlet',
    canActivate: [hasRole('lab')],
    loadComponent: () => import('./my-invoices/my-invoices').then((m) => m.MyInvoices),
  },
  {
    path: 'rounds/:id/ledger',
    title: 'Fees ledger · Ringlet',
    canActivate: [hasRole('coordinator')],
    loadComponent: () => import('./fees-ledger/fees-ledger').then((m) => m.FeesLedger),
  },
];
