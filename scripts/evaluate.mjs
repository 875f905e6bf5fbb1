// npm run evaluate -- FILE.csv|FILE.xlsx [options]: the offline evaluation command, compiled.
// The command is bundled once into dist/cli/evaluate.cjs with esbuild (again whenever a source
// is newer), so a run starts plain JavaScript instead of compiling TypeScript at every start.
import { existsSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { newestMtime, root } from './lib.mjs';

const out = join(root, 'dist/cli/evaluate.cjs');

export async function buildEvaluateCommand() {
  const { build } = await import('esbuild');
  await build({
    entryPoints: [join(root, 'api/src/cli/evaluate.ts')],
    outfile: out,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    // exceljs is loaded only for .xlsx input; keep it a runtime require from node_modules.
    external: ['exceljs'],
    // Less to read and parse at every start; names stay, so a failure's stack still reads.
    minifyWhitespace: true,
    minifySyntax: true,
    logLevel: 'warning',
  });
}

const built = existsSync(out) ? statSync(out).mtimeMs : 0;
// The bundle holds api/src/cli and parts of shared/ (statistics, the CSV reader).
if (built <= newestMtime(['api/src/cli', 'shared', 'scripts/evaluate.mjs']))
  await buildEvaluateCommand();
createRequire(import.meta.url)(out);
