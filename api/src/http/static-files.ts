/**
 * The built web app: precompressed files (brotli, then gzip, as the browser accepts; written by
 * scripts/precompress.mjs at build time) and cache headers by kind of file. Angular's output
 * names carry a content hash (`main-ABCD1234.js`), so those are cached for a year and never
 * revalidated; anything else is revalidated after an hour, and index.html on every visit.
 * Mounted ahead of sessions and sign-in (api/src/app.ts): a file costs no PostgreSQL read.
 *
 * index.html names, for the page asked for, every script file that page needs
 * (`<link rel="modulepreload">`, from route-preloads.json that scripts/route-preloads.mjs writes
 * at build time), so the page's code downloads beside main.js instead of level by level after it.
 * The page is read once and kept in memory; its ETag lets a revisit get a 304.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Router } from 'express';
import expressStaticGzip from 'express-static-gzip';

/**
 * `name-HASH.ext` as Angular's production build writes it (`main-ABCD1234.js`; the chunk
 * optimizer's chunks carry a base64url hash, `chunk-Cla-rRO_.js`), or its precompressed copy.
 */
const HASHED = /-[A-Za-z0-9_-]{8}\.(js|css|woff2?|ttf|svg|png|jpg|webp)(\.br|\.gz)?$/;

export const IMMUTABLE = 'public, max-age=31536000, immutable';

export function cacheControlFor(path: string): string {
  return HASHED.test(path) ? IMMUTABLE : 'public, max-age=3600';
}

/** A page of the web app (`board/rounds/:id`) and the script files it needs. */
export interface RoutePreload {
  path: string;
  files: string[];
}

/** The files of the first page whose pattern matches `pathname` as a whole (none: empty). */
export function preloadsFor(table: readonly RoutePreload[], pathname: string): string[] {
  const segments = pathname.split('/').filter((s) => s !== '');
  const page = table.find((p) => {
    const own = p.path.split('/').filter((s) => s !== '');
    return (
      own.length === segments.length && own.every((s, i) => s.startsWith(':') || s === segments[i])
    );
  });
  return page?.files ?? [];
}

const SAFE_FILE = /^[\w.-]+\.js$/;

function readTable(dir: string): RoutePreload[] {
  const path = join(dir, 'route-preloads.json');
  if (!existsSync(path)) return [];
  const table = JSON.parse(readFileSync(path, 'utf8')) as RoutePreload[];
  return table.map((p) => ({ path: p.path, files: p.files.filter((f) => SAFE_FILE.test(f)) }));
}

/** index.html with the page's own modulepreload links ahead of the main script. */
export function pageHtml(html: string, files: readonly string[]): string {
  if (files.length === 0) return html;
  const links = files.map((f) => `<link rel="modulepreload" href="${f}">`).join('');
  const at = html.indexOf('<script src="main-');
  return at < 0
    ? html.replace('</head>', `${links}</head>`)
    : html.slice(0, at) + links + html.slice(at);
}

/** Serves `dir` (a built app) with its SPA fallback; null when there is no build there. */
export function webApp(dir: string): Router | null {
  if (!existsSync(join(dir, 'index.html'))) return null;
  const index = readFileSync(join(dir, 'index.html'), 'utf8');
  const table = readTable(dir);
  const pages = new Map<string, string>();
  const router = express.Router();
  router.use(
    expressStaticGzip(dir, {
      enableBrotli: true,
      orderPreference: ['br', 'gz'],
      index: false,
      serveStatic: {
        index: false,
        setHeaders: (res, path) => res.setHeader('Cache-Control', cacheControlFor(path)),
      },
    }),
  );
  // The app is mounted before the session middleware (no database read for a file), so the
  // fallback leaves the API's paths to the API and its 404s.
  router.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/') || !req.accepts('html')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    const files = preloadsFor(table, req.path);
    const key = files.join(' ');
    let html = pages.get(key);
    if (html === undefined) pages.set(key, (html = pageHtml(index, files)));
    res.type('html').send(html);
  });
  return router;
}
