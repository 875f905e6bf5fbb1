// Writes brotli (.br) and gzip (.gz) copies beside each compressible file of the built web app,
// so the server sends compressed bytes without compressing on every request.
//   node scripts/precompress.mjs [dir]   (default dist/web/browser)
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import { root } from './lib.mjs';

const COMPRESSIBLE = /\.(js|mjs|css|html|svg|json|txt|map|ttf|ico|webmanifest)$/;
const MIN_BYTES = 1024;

export function precompress(dir = join(root, 'dist/web/browser')) {
  let files = 0;
  let before = 0;
  let after = 0;
  const walk = (d) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      const s = statSync(p);
      if (s.isDirectory()) walk(p);
      else if (COMPRESSIBLE.test(name) && s.size >= MIN_BYTES) {
        const bytes = readFileSync(p);
        const br = brotliCompressSync(bytes, {
          params: {
            [constants.BROTLI_PARAM_QUALITY]: 11,
            [constants.BROTLI_PARAM_SIZE_HINT]: bytes.length,
          },
        });
        writeFileSync(p + '.br', br);
        writeFileSync(p + '.gz', gzipSync(bytes, { level: 9 }));
        files++;
        before += bytes.length;
        after += br.length;
      }
    }
  };
  walk(dir);
  return { files, before, after };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { files, before, after } = precompress(process.argv[2]);
  console.log(
    `[ringlet] precompressed ${files} files: ${(before / 1024).toFixed(0)} kB → ${(after / 1024).toFixed(0)} kB brotli`,
  );
}
