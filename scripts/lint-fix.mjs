// npm run lint:fix: ESLint's fixes over the whole tree, including the rules switched off until the
// branches are merged (autofixRules in eslint.config.mjs), then Prettier on the files that changed.
// Run it on a clean working tree: the files it touches are read from `git diff`.
import { spawnSync } from 'node:child_process';
import { autofixRules } from '../eslint.config.mjs';
import { bin, log } from './lib.mjs';

// The typed rules exist for TypeScript files only (plain JavaScript has no type information).
const tsArgs = ['--fix', '**/*.ts'];
for (const [name, value] of Object.entries(autofixRules)) {
  tsArgs.push('--rule', JSON.stringify({ [name]: value }));
}
log('eslint --fix over the TypeScript files (a few minutes on 2 cores)…');
const ts = spawnSync(bin('eslint'), tsArgs, { stdio: 'inherit' });
log('eslint --fix over the JavaScript files and the Angular templates…');
const plain = spawnSync(bin('eslint'), ['--fix', '**/*.{js,mjs,cjs}', 'web/src/**/*.html'], {
  stdio: 'inherit',
});
const changed = spawnSync('git', ['diff', '--name-only'], { encoding: 'utf8' })
  .stdout.split('\n')
  .filter(Boolean);
if (changed.length > 0) {
  log(`prettier on ${changed.length} changed files…`);
  spawnSync(bin('prettier'), ['--write', '--ignore-unknown', '--log-level=warn', ...changed], {
    stdio: 'inherit',
  });
}
process.exit(Math.max(ts.status ?? 1, plain.status ?? 1));
