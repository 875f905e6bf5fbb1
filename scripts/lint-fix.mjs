// npm run lint:fix: ESLint's fixes over the whole tree, including the autofix-only rules switched
// off until the open branches are merged (RINGLET_LINT_AUTOFIX=1 turns them on, see autofixRules in
// eslint.config.mjs), then Prettier on the files that changed. Run it on a clean working tree: the
// files it touches are read from `git diff`.
import { spawnSync } from 'node:child_process';
import { bin, log } from './lib.mjs';

log('eslint --fix over the tree (several minutes on 2 cores)…');
const eslint = spawnSync(bin('eslint'), ['.', '--fix'], {
  stdio: 'inherit',
  env: { ...process.env, RINGLET_LINT_AUTOFIX: '1' },
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
process.exit(eslint.status ?? 1);
