// Adds `<link rel="modulepreload">` to the built index.html for every script the app needs at
// start, so the browser asks for all of them at once instead of discovering them level by level.
//   node scripts/web-hints.mjs [dir]   (default dist/web; reads dir/stats.json, edits dir/browser)
// Why: Angular's build writes at most 10 such links (MODULE_PRELOAD_MAX in @angular/build), so
// the rest of the start-up scripts, Angular's core among them, were asked for only once the
// first ten had loaded. The shared contracts (zod; web/src/app/core/contracts.ts) are a lazy
// chunk that the shell nevertheless loads on every page at once: they are preloaded too.
// Reads the esbuild metafile that `"statsJson": true` (angular.json) writes; without it, or when
// it does not describe this build, it leaves index.html as it is.
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { root } from './lib.mjs';

/**
 * Lazy chunks the shell loads on every page (besides the static start-up graph), known by the
 * names they export (a lazy chunk keeps its export names; the metafile of Angular's chunk
 * optimizer no longer says which source file a chunk started from): the shared contracts.
 */
const ALWAYS_LOADED = [['HealthResponse', 'Me', 'homePath']];

/**
 * Output files by their file name, with the names of the files each one imports statically,
 * their export names and source inputs.
 */
export function outputsOf(metafile) {
  const outputs = new Map();
  for (const [path, out] of Object.entries(metafile.outputs ?? {})) {
    if (!path.endsWith('.js')) continue;
    outputs.set(basename(path), {
      imports: (out.imports ?? [])
        .filter((i) => i.kind === 'import-statement')
        .map((i) => basename(i.path)),
      exports: out.exports ?? [],
      inputs: Object.keys(out.inputs ?? {}),
    });
  }
  return outputs;
}

/** `start` and every file it imports statically, directly or not. */
export function closure(outputs, start, into = new Set()) {
  if (into.has(start) || !outputs.has(start)) return into;
  into.add(start);
  for (const i of outputs.get(start).imports) closure(outputs, i, into);
  return into;
}

/** The build in `dir`: its outputs (from stats.json) and index.html; null without stats.json. */
export function readBuild(dir) {
  const stats = join(dir, 'stats.json');
  const indexPath = join(dir, 'browser', 'index.html');
  if (!existsSync(stats) || !existsSync(indexPath)) return null;
  const outputs = outputsOf(JSON.parse(readFileSync(stats, 'utf8')));
  return { outputs, indexPath, html: readFileSync(indexPath, 'utf8') };
}

export function addPreloadHints(dir = join(root, 'dist/web')) {
  const build = readBuild(dir);
  if (!build) return { added: 0, reason: 'no stats.json' };
  const { outputs, indexPath } = build;
  let html = build.html;
  const main = /<script src="(main-[^"]+\.js)" type="module"><\/script>/.exec(html);
  if (!main || !outputs.has(main[1])) return { added: 0, reason: 'main script not in stats.json' };
  const wanted = closure(outputs, main[1]);
  for (const [file, out] of outputs)
    if (ALWAYS_LOADED.some((names) => names.every((name) => out.exports.includes(name))))
      closure(outputs, file, wanted);
  wanted.delete(main[1]);
  const missing = [...wanted].filter(
    (file) => !html.includes(`href="${file}"`) && existsSync(join(dir, 'browser', file)),
  );
  const links = missing.map((file) => `<link rel="modulepreload" href="${file}">`).join('');
  html = html.replace(main[0], links + main[0]);
  writeFileSync(indexPath, html);
  return { added: missing.length };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { added, reason } = addPreloadHints(process.argv[2]);
  console.log(
    `[ringlet] index.html: ${added} more modulepreload links${reason ? ` (${reason})` : ''}`,
  );
}
