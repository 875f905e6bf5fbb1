// npm start: local PostgreSQL, the production web build, then the API + web server in demo mode.
import { buildWebIfStale, log, root, spawn, startPostgres } from './lib.mjs';

const t0 = Date.now();
startPostgres();
buildWebIfStale();

const env = { ...process.env, RINGLET_MODE: process.env.RINGLET_MODE || 'demo', PORT: process.env.PORT || '3000' };
log(`starting the server (${env.RINGLET_MODE} mode)…`);
const child = spawn(process.execPath, ['--import', 'tsx', 'api/src/server.ts'], { cwd: root, env, stdio: 'inherit' });
child.on('exit', (code) => process.exit(code ?? 0));
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => child.kill(sig));
process.env.RINGLET_START_T0 = String(t0);
