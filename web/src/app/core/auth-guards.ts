import { inject } from '@angular/core';
import { type CanActivateFn, Router, type UrlTree } from '@angular/router';
import type { Role } from '@ringlet/shared/contracts/auth';
import { loadContracts } from './contracts';
import { AuthService } from './auth-service';
import { HealthService } from './health-service';

function signInTree(router: Router, returnUrl: string): UrlTree {
  return router.createUrlTree(['/sign-in'], {
    queryParams: returnUrl && returnUrl !== '/' ? { returnUrl } : {},
  });
}

/** Lets signed-in users through; everyone else goes to the sign-in page (and back afterwards). */
export const authGuard: CanActivateFn = async (_route, state) => {
  const router = inject(Router);
  const me = await inject(AuthService).ensureLoaded();
  return me ? true : signInTree(router, state.url);
};

/** Lets users with `role` through; others go to their own home page. */
export function roleGuard(role: Role): CanActivateFn {
  return async (_route, state) => {
    const router = inject(Router);
    const me = await inject(AuthService).ensureLoaded();
    if (!me) return signInTree(router, state.url);
    if (me.roles.includes(role)) return true;
    return router.parseUrl((await loadContracts()).homePath(me.roles));
  };
}

/** Lets lab managers (and admins) through. */
export const labManagerGuard: CanActivateFn = async (_route, state) => {
  const router = inject(Router);
  const me = await inject(AuthService).ensureLoaded();
  if (!me) return signInTree(router, state.url);
  if (me.roles.includes('admin') || me.memberships.some((m) => m.isManager)) return true;
  return router.parseUrl((await loadContracts()).homePath(me.roles));
};

/** Sends `/` to the signed-in user's home page. */
export const homeRedirectGuard: CanActivateFn = async () => {
  const router = inject(Router);
  const me = await inject(AuthService).ensureLoaded();
  if (!me) return router.parseUrl('/sign-in');
  return router.parseUrl((await loadContracts()).homePath(me.roles));
};

/** The Outbox exists only when the server runs in demo or development mode. */
export const outboxGuard: CanActivateFn = async () => {
  const router = inject(Router);
  const health = inject(HealthService);
  await health.ensureLoaded();
  return health.hasOutbox() ? true : router.parseUrl('/not-found');
};
