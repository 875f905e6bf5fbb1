// npm start: local PostgreSQL, the production builds (web and server; each skipped when newer
// than its sources), then the compiled server (dist/api/server.js) under plain node, in demo mode.
import { buildWebIfStale, log, root, spawn, startPostgres } from './lib.mjs';
import { buildServerIfStale, SERVER_OUT } from './server-build.mjs';

const t0 = Date.now();
startPostgres();
buildWebIfStale();
await buildServerIfStale();

const env = {
  ...process.env,
  RINGLET_MODE: process.env.RINGLET_MODE || 'demo',
  PORT: process.env.PORT || '3000',
  RINGLET_START_T0: String(t0),
};
log(`starting the server (${env.RINGLET_MODE} mode)…`);
const child = spawn(process.execPath, ['--enable-source-maps', SERVER_OUT], {
  cwd: root,
  env,
  stdio: 'inherit',
});
child.on('exit', (code) => process.exit(code ?? 0));
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => child.kill(sig));
