// The server's production build: api/src/server.ts bundled by esbuild into one CommonJS file,
// dist/api/server.js (plus a source map), started with plain `node`. Our code (api/, db/,
// reports/, shared/ through the @ringlet/shared/* alias of tsconfig.json) is bundled, and so is
// typeorm (BUNDLED_PACKAGES); other packages stay in node_modules. dist/api/ sits two folders below the repository like api/src/, so the
// path to the built web app (dist/web/browser) is the same in both.
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { log, newestMtime, root } from './lib.mjs';

export const SERVER_OUT = join(root, 'dist/api/server.js');
const SOURCES = [
  'api/src',
  'db',
  'reports',
  'shared',
  'tsconfig.json',
  'tsconfig.node.json',
  'package-lock.json',
  'scripts/server-build.mjs',
];

/**
 * Packages the server needs only for some requests (spreadsheets, zip files, PDF), loaded at their
 * first use instead of at start: each is replaced by a stand-in that requires the package when a
 * property is read, or it is called or constructed. Only for packages imported as a default
 * import (`import ExcelJS from 'exceljs'`), which is how the code uses them.
 */
const LAZY_PACKAGES = ['exceljs', 'jszip', 'pdfkit', 'stripe', 'nodemailer'];

export const lazyPackages = {
  name: 'lazy-packages',
  setup(b) {
    const filter = new RegExp(`^(${LAZY_PACKAGES.join('|')})$`);
    b.onResolve({ filter }, (args) =>
      args.namespace === 'lazy'
        ? { path: args.path, external: true }
        : { path: args.path, namespace: 'lazy' },
    );
    b.onLoad({ filter: /.*/, namespace: 'lazy' }, (args) => ({
      loader: 'js',
      contents: `let m;
const load = () => (m ??= require(${JSON.stringify(args.path)}));
module.exports = new Proxy(function () {}, {
  get: (_t, p) => (p === '__esModule' ? undefined : load()[p]),
  has: (_t, p) => p in load(),
  apply: (_t, self, args) => load().apply(self, args),
  construct: (_t, args) => new (load())(...args),
});`,
    }));
  },
};

/**
 * Packages bundled into server.js rather than loaded from node_modules: typeorm is ~300 small
 * files, and finding and reading each at start cost more than running them (cold start, see
 * docs/QUALITY.md). Optional drivers it names but Ringlet does not use stay unresolved requires.
 */
const BUNDLED_PACKAGES = ['typeorm'];
const TYPEORM_OPTIONAL = [
  'pg-native',
  'pg-query-stream',
  'mongodb',
  'mysql',
  'mysql2',
  'oracledb',
  'sqlite3',
  'better-sqlite3',
  'sql.js',
  'mssql',
  'redis',
  'ioredis',
  'react-native-sqlite-storage',
  '@sap/hana-client',
  '@sap/hana-client/extension/Stream',
  'hdb-pool',
  'typeorm-aurora-data-api-driver',
  '@google-cloud/spanner',
  'expo-sqlite',
];

/** Every package of package.json except BUNDLED_PACKAGES (and their sub-paths) stays external. */
function externalPackages() {
  const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
  return Object.keys({ ...pkg.dependencies, ...pkg.devDependencies })
    .filter((name) => !BUNDLED_PACKAGES.includes(name))
    .flatMap((name) => [name, `${name}/*`])
    .concat(TYPEORM_OPTIONAL);
}

export async function buildServer() {
  const { build } = await import('esbuild');
  const t0 = Date.now();
  await build({
    absWorkingDir: root,
    // The upload worker thread is its own entry: api/src/workers/pool.ts starts file-worker.js
    // from the folder it runs in (dist/api/ once bundled).
    entryPoints: ['api/src/server.ts', 'api/src/workers/file-worker.ts'],
    outdir: join(root, 'dist/api'),
    entryNames: '[name]',
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    external: externalPackages(),
    tsconfig: 'tsconfig.node.json',
    sourcemap: true,
    logLevel: 'warning',
    plugins: [lazyPackages],
  });
  log(`server built: dist/api/server.js and file-worker.js (${Date.now() - t0} ms)`);
}

/** Builds the server unless dist/api/server.js is newer than every source it comes from. */
export async function buildServerIfStale() {
  const built = existsSync(SERVER_OUT) ? statSync(SERVER_OUT).mtimeMs : 0;
  if (built > newestMtime(SOURCES) && !process.env.RINGLET_FORCE_BUILD) {
    log('server is up to date (dist/api)');
    return;
  }
  log('building the server…');
  await buildServer();
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].replace(/^.*\//, '/'))) {
  await buildServer();
}
