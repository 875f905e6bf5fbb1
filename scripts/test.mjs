// npm test: everything the tests need, then every test (type-check, lint, jest: shared, api, web, e2e).
import { bin, buildWebIfStale, ensureChromium, log, run, startPostgres } from './lib.mjs';

const extra = process.argv.slice(2);
startPostgres();
ensureChromium();
log('type-checking…');
run('npm', ['run', '--silent', 'typecheck']);
log('linting…');
run(bin('eslint'), ['.', '--max-warnings=0']);
log('checking formatting (prettier --check; `npm run format` fixes it)…');
run(bin('prettier'), ['--check', '--log-level=warn', '.']);
log('building the test template database…');
run(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'template']);
buildWebIfStale();
log('running jest (shared, api, web, e2e)…');
run(bin('jest'), ['--ci', '--maxWorkers=2', ...extra], {
  env: { ...process.env, NODE_ENV: 'test' },
});
