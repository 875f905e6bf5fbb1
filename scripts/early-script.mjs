// Builds the early script (web/src/early/early.ts: asks who is signed in and the first page's data
// before the app has loaded) into the built web app as early-HASH.js and names it in index.html
// (`async`, so it never holds up the page).
//   node scripts/early-script.mjs [dir]   (default dist/web/browser)
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildSync } from 'esbuild';
import { root } from './lib.mjs';

export function addEarlyScript(dir = join(root, 'dist/web/browser')) {
  const indexPath = join(dir, 'index.html');
  if (!existsSync(indexPath)) return { file: null };
  const out = buildSync({
    entryPoints: [join(root, 'web/src/early/early.ts')],
    bundle: true,
    format: 'iife',
    minify: true,
    target: 'es2022',
    write: false,
  });
  const code = out.outputFiles[0].contents;
  const file = `early-${createHash('sha256').update(code).digest('base64url').slice(0, 8)}.js`;
  writeFileSync(join(dir, file), code);
  const tag = `<script src="${file}" async></script>`;
  let html = readFileSync(indexPath, 'utf8').replace(
    /<script src="early-[^"]+" async><\/script>/,
    '',
  );
  html = html.replace(/(<base [^>]*>)/, `$1${tag}`);
  writeFileSync(indexPath, html);
  return { file, bytes: code.length };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { file, bytes } = addEarlyScript(process.argv[2]);
  console.log(`[ringlet] early script: ${file ? `${file} (${bytes} bytes)` : 'no web build'}`);
}
