import type { Routes } from '@angular/router';
import { authGuard } from '../core/auth-guards';

export const AUTH_ROUTES: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Ringlet',
    loadComponent: () => import('./sign-in').then((m) => m.SignIn),
  },
  {
    path: 'forgot-password',
    title: 'Forgot password · Ringlet',
    loadComponent: () => import('./forgot-password').then((m) => m.ForgotPassword),
  },
  {
    path: 'set-password/:token',
    title: 'Set password · Ringlet',
    loadComponent: () => import('./set-password').then((m) => m.SetPassword),
  },
  {
    path: 'account/password',
    title: 'Change password · Ringlet',
    canActivate: [authGuard],
    loadComponent: () => import('./change-password').then((m) => m.ChangePassword),
  },
  {
    path: 'lab-invitations',
    title: 'Lab invitations · Ringlet',
    canActivate: [authGuard],
    loadComponent: () => import('./lab-invitations').then((m) => m.LabInvitations),
  },
];
