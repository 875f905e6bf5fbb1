// Helpers shared by start.mjs and test.mjs (plain Node, no dependencies).
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..');

export function log(msg) {
  console.log(`\x1b[36m[ringlet]\x1b[0m ${msg}`);
}

/** Runs a command in the repo, streaming its output; exits the script when it fails. */
export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', ...opts });
  if (r.status !== 0) {
    console.error(`[ringlet] ${cmd} ${args.join(' ')} failed (exit ${r.status ?? r.signal})`);
    process.exit(r.status ?? 1);
  }
}

export function bin(name) {
  return join(root, 'node_modules', '.bin', name);
}

/** Newest modification time below the given folders (files only). */
export function newestMtime(paths) {
  let newest = 0;
  const walk = (p) => {
    if (!existsSync(p)) return;
    const s = statSync(p);
    if (s.isDirectory()) {
      for (const e of readdirSync(p))
        if (e !== 'node_modules' && !e.startsWith('.')) walk(join(p, e));
    } else if (!p.endsWith('.spec.ts')) newest = Math.max(newest, s.mtimeMs);
  };
  for (const p of paths) walk(join(root, p));
  return newest;
}

/** Builds the production web app unless dist/ is newer than every source it comes from. */
export function buildWebIfStale() {
  const index = join(root, 'dist/web/browser/index.html');
  const built = existsSync(index) ? statSync(index).mtimeMs : 0;
  const sources = newestMtime([
    'web/src',
    'shared',
    'angular.json',
    'tsconfig.json',
    'web/tsconfig.app.json',
    'package-lock.json',
  ]);
  if (built > sources && !process.env.RINGLET_FORCE_BUILD) {
    log('web app is up to date (dist/web)');
    return;
  }
  log('building the web app (production)…');
  run(process.execPath, [join(root, 'scripts/icons.mjs')]);
  // NG_BUILD_OPTIMIZE_CHUNKS: Angular's chunk optimizer merges the many small start-up chunks
  // (fewer requests on a first visit); web-hints.mjs then preloads every start-up script.
  run(bin('ng'), ['build', '--configuration', 'production'], {
    env: { ...process.env, NG_BUILD_OPTIMIZE_CHUNKS: '1' },
  });
  run(process.execPath, [join(root, 'scripts/web-hints.mjs')]);
  // Each page's own scripts, announced by the server in index.html, and the early data calls.
  run(process.execPath, [join(root, 'scripts/route-preloads.mjs')]);
  run(process.execPath, [join(root, 'scripts/early-script.mjs')]);
  run(process.execPath, [join(root, 'scripts/precompress.mjs')]);
}

export function startPostgres() {
  if (process.env.DATABASE_URL) {
    log('DATABASE_URL is set: using that PostgreSQL server');
    return;
  }
  run('bash', ['db/postgres.sh', 'start']);
}

/** Debian's chromium for the browser tests; installed when missing and we may (root). */
export function ensureChromium() {
  const path = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
  if (existsSync(path)) return;
  if (process.getuid?.() === 0) {
    log("chromium not found; installing Debian's chromium package…");
    run('bash', [
      '-c',
      'apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium',
    ]);
  } else {
    console.error(
      `[ringlet] chromium not found at ${path}. Install it: sudo apt-get install chromium`,
    );
    process.exit(1);
  }
}

export { spawn };
