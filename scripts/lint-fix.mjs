// npm run lint:fix: ESLint's fixes over the whole tree, including the rules switched off until the
// branches are merged (autofixRules in eslint.config.mjs), then Prettier on the files that changed.
// Run it on a clean working tree: the files it touches are read from `git diff`.
import { spawnSync } from 'node:child_process';
import { autofixRules } from '../eslint.config.mjs';
import { bin, log } from './lib.mjs';

const args = ['.', '--fix'];
for (const [name, value] of Object.entries(autofixRules)) {
  args.push('--rule', JSON.stringify({ [name]: value }));
}
log('eslint --fix over the tree (a few minutes on 2 cores)…');
const eslint = spawnSync(bin('eslint'), args, { stdio: 'inherit' });
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
