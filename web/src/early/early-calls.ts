/**
 * The calls a page makes as it opens, asked for by a small script that runs before the app
 * (web/src/early/early.ts, built by scripts/early-script.mjs and loaded `async` by index.html):
 * who is signed in, then the page's data, while main.js still downloads and starts. The app takes
 * each answer once instead of asking again (core/early-responses.ts).
 *
 * Keep EARLY_PAGES in step with what those pages ask for on opening (BoardService.board,
 * BenchRound's load): a call that differs is not wasted work for the app, it just asks again.
 * `{lab}` stands for `?labId=<the acting lab>` as BenchService adds it (nothing when there is
 * none).
 */

/** The global the early script leaves its requests in: full URL → the fetch's answer. */
export const EARLY_GLOBAL = 'ringletEarly';

export type EarlyRequests = Map<string, Promise<Response>>;

/** First path segments of the pages behind sign-in (checked against app-routes by its spec). */
export const SIGNED_IN_AREAS: ReadonlySet<string> = new Set([
  '',
  'desk',
  'bench',
  'assessor',
  'admin',
  'provider',
  'billing',
  'outbox',
  'board',
  'no-role',
]);

export const ME_URL = '/api/v1/auth/me';

export const EARLY_PAGES: readonly { path: string; calls: readonly string[] }[] = [
  { path: 'board/rounds/:id', calls: ['rounds/:id/board'] },
  {
    path: 'bench/rounds/:id',
    calls: [
      'my/rounds/:id{lab}',
      'rounds/:id/submission{lab}',
      'rounds/:id/submission/attachments{lab}',
      'my/instrument-checks{lab}',
    ],
  },
];

function segmentsOf(pathname: string): string[] {
  return pathname.split('/').filter((s) => s !== '');
}

/** Whether opening `pathname` asks who is signed in (a page behind sign-in). */
export function asksWhoIsSignedIn(pathname: string): boolean {
  return SIGNED_IN_AREAS.has(segmentsOf(pathname)[0] ?? '');
}

/** The data calls (full URLs) the page at `pathname` makes on opening, for this acting lab. */
export function earlyCalls(pathname: string, actingLabId: string | null): string[] {
  const segments = segmentsOf(pathname);
  for (const page of EARLY_PAGES) {
    const own = segmentsOf(page.path);
    if (own.length !== segments.length) continue;
    if (!own.every((s, i) => s.startsWith(':') || s === segments[i])) continue;
    const params = new Map(own.map((s, i) => [s, segments[i]!]));
    const lab = actingLabId ? `?labId=${encodeURIComponent(actingLabId)}` : '';
    return page.calls.map(
      (call) =>
        '/api/v1/' +
        call.replace(/:\w+/g, (p) => encodeURIComponent(params.get(p) ?? p)).replace('{lab}', lab),
    );
  }
  return [];
}

/**
 * Asks, now, who is signed in and then the page's data (only for someone signed in, so a
 * signed-out visitor causes no refused data call). Never throws: the app asks for itself what is
 * not here.
 */
export function startEarlyCalls(pathname: string, fetchFn: typeof fetch): EarlyRequests {
  const started: EarlyRequests = new Map();
  if (!asksWhoIsSignedIn(pathname)) return started;
  const get = (url: string) => {
    const answer = fetchFn(url, { headers: { Accept: 'application/json, text/plain, */*' } });
    started.set(url, answer);
    return answer;
  };
  get(ME_URL)
    .then((r) => (r.ok ? (r.clone().json() as Promise<{ actingLabId?: string | null }>) : null))
    .then((me) => {
      if (me) for (const url of earlyCalls(pathname, me.actingLabId ?? null)) void get(url);
    })
    .catch(() => undefined);
  return started;
}
