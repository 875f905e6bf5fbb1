import { inject } from '@angular/core';
import { Router, type CanActivateFn, type Routes } from '@angular/router';
import { AuthService } from '../core/auth-service';

/** Admins and coordinators edit the provider profile; others go home. */
export const providerEditorGuard: CanActivateFn = async () => {
  const me = await inject(AuthService).ensureLoaded();
  if (me && (me.roles.includes('admin') || me.roles.includes('coordinator'))) return true;
  return inject(Router).parseUrl('/');
};

export const PROVIDER_ROUTES: Routes = [
  {
    path: '',
    title: 'PT provider · Ringlet',
    canActivate: [providerEditorGuard],
    loadComponent: () =>
      import('./provider-profile/provider-profile').then((m) => m.ProviderProfilePage),
  },
];
