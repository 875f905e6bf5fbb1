import type { Route, Routes } from '@angular/router';

/**
 * Starts loading the code of the page at `pathname` at once: the lazy route files on its way
 * (`loadChildren`) and the page component (`loadComponent`). The router itself loads a page
 * component only after the guards have run, that is after `GET /auth/me` has answered; started
 * here, the page's chunk (and the grid or form code it imports) downloads while the guards wait.
 * The router's own calls later find the modules loaded. Guards still decide what is shown: this
 * only fetches script files, which the server hands to anyone.
 *
 * Follows plain `path` routes only (literal segments and `:params`); a custom `matcher` or `**`
 * is skipped, so such pages load as before. Never throws: a failed prefetch is retried by the
 * router in its usual place.
 */
export async function prefetchPage(routes: Routes, pathname: string): Promise<void> {
  try {
    await prefetchIn(
      routes,
      pathname.split('/').filter((s) => s !== ''),
    );
  } catch {
    // The router loads (and reports) it again when it gets there.
  }
}

async function prefetchIn(routes: Routes, segments: readonly string[]): Promise<void> {
  for (const route of routes) {
    const rest = consume(route, segments);
    if (rest === null) continue;
    const component = route.loadComponent?.();
    const children = route.children ?? (await loadedChildren(route));
    await Promise.all([component, children ? prefetchIn(children, rest) : undefined]);
    return;
  }
}

/** The segments left once `route` matched the start of `segments`, or null when it does not. */
export function consume(route: Route, segments: readonly string[]): readonly string[] | null {
  if (route.matcher || route.path === undefined || route.path === '**') return null;
  const own = route.path.split('/').filter((s) => s !== '');
  if (own.length > segments.length) return null;
  if (own.some((s, i) => !s.startsWith(':') && s !== segments[i])) return null;
  const rest = segments.slice(own.length);
  if (route.pathMatch === 'full' && rest.length > 0) return null;
  // A leaf route (no children of its own) matches only the whole remaining path.
  if (rest.length > 0 && !route.children && !route.loadChildren) return null;
  return rest;
}

async function loadedChildren(route: Route): Promise<Routes | null> {
  if (!route.loadChildren) return null;
  const loaded: unknown = await route.loadChildren();
  return Array.isArray(loaded) ? (loaded as Routes) : null;
}
