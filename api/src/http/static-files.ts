/**
 * The built web app: precompressed files (brotli, then gzip, as the browser accepts; written by
 * scripts/precompress.mjs at build time) and cache headers by kind of file. Angular's output
 * names carry a content hash (`main-ABCD1234.js`), so those are cached for a year and never
 * revalidated; anything else is revalidated after an hour, and index.html on every visit.
 * Mounted ahead of sessions and sign-in (api/src/app.ts): a file costs no PostgreSQL read.
 */
import { existsSync } from 'node:fs';
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

/** Serves `dir` (a built app) with its SPA fallback; null when there is no build there. */
export function webApp(dir: string): Router | null {
  if (!existsSync(join(dir, 'index.html'))) return null;
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
    res.sendFile(join(dir, 'index.html'));
  });
  return router;
}
