import type { Routes } from '@angular/router';
import { consume, prefetchPage } from './page-prefetch';

/** A route tree shaped like app-routes.ts and board-routes.ts, recording what gets loaded. */
function tree() {
  const loaded: string[] = [];
  const page = (name: string) => () => {
    loaded.push(name);
    return Promise.resolve(class {});
  };
  const board: Routes = [
    {
      path: '',
      children: [
        { path: '', loadComponent: page('board-list') },
        { path: 'rounds/:id', loadComponent: page('board-page') },
        { path: 'rounds/:id/scores', loadComponent: page('scores-page') },
      ],
    },
  ];
  const routes: Routes = [
    { path: '', pathMatch: 'full', children: [] },
    { matcher: () => ({ consumed: [] }), loadChildren: () => Promise.resolve([]) },
    { path: 'bench/lab-members', loadComponent: page('lab-members') },
    {
      path: 'board',
      loadChildren: () => {
        loaded.push('board-routes');
        return Promise.resolve(board);
      },
    },
    { path: '**', loadComponent: page('not-found') },
  ];
  return { routes, loaded };
}

describe('prefetchPage', () => {
  it('loads the route files and the component of the page that is opened, and nothing else', async () => {
    const { routes, loaded } = tree();
    await prefetchPage(routes, '/board/rounds/7');
    expect(loaded).toEqual(['board-routes', 'board-page']);
  });

  it('follows deeper paths and the empty child path', async () => {
    for (const [path, page] of [
      ['/board/rounds/7/scores', 'scores-page'],
      ['/board', 'board-list'],
      ['/board/', 'board-list'],
    ] as const) {
      const { routes, loaded } = tree();
      await prefetchPage(routes, path);
      expect(loaded).toEqual(['board-routes', page]);
    }
  });

  it('leaves custom matchers, the not-found page and unknown paths to the router', async () => {
    for (const path of ['/', '/sign-in', '/nowhere/at/all', '/board/rounds']) {
      const { routes, loaded } = tree();
      await prefetchPage(routes, path);
      expect(loaded.filter((l) => l !== 'board-routes')).toEqual([]);
    }
  });

  it('swallows a failed load (the router loads it again and reports it)', async () => {
    const routes: Routes = [{ path: 'x', loadComponent: () => Promise.reject(new Error('net')) }];
    await expect(prefetchPage(routes, '/x')).resolves.toBeUndefined();
  });
});

describe('consume', () => {
  it('matches literal segments and parameters, honouring pathMatch full', () => {
    expect(consume({ path: 'rounds/:id' }, ['rounds', '7'])).toEqual([]);
    expect(consume({ path: 'rounds/:id' }, ['rounds'])).toBeNull();
    expect(consume({ path: 'rounds/:id' }, ['desks', '7'])).toBeNull();
    expect(consume({ path: '', pathMatch: 'full' }, ['a'])).toBeNull();
    expect(consume({ path: 'a', children: [] }, ['a', 'b'])).toEqual(['b']);
    expect(consume({ path: 'a' }, ['a', 'b'])).toBeNull();
  });
});
