import type { Routes } from '@angular/router';

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
];
