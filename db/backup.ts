import { spawn } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { grantRuntimeRole, migrateDatabase } from './migrate';
import { createDataSource } from './data-source';

/** pg_dump / pg_restore: PATH first, else the newest Debian PostgreSQL install (db/postgres.sh uses the same). */
export function pgTool(name: 'pg_dump' | 'pg_restore'): string {
  const root = '/usr/lib/postgresql';
  if (existsSync(root)) {
    const versions = readdirSync(root).filter((v) => /^\d+$/.test(v)).sort((a, b) => Number(b) - Number(a));
    for (const v of versions) {
      const p = join(root, v, 'bin', name);
      if (existsSync(p)) return p;
    }
  }
  return name;
}

/** libpq reads the password from PGPASSWORD rather than from a command line other users could see. */
function connection(url: string): { args: string[]; env: NodeJS.ProcessEnv } {
  const u = new URL(url);
  const env: NodeJS.ProcessEnv = { ...process.env, PGPASSWORD: decodeURIComponent(u.password) };
  const sslmode = u.searchParams.get('sslmode');
  if (sslmode) env['PGSSLMODE'] = sslmode;
  return {
    args: ['-h', u.hostname, '-p', u.port || '5432', '-U', decodeURIComponent(u.username), '-d', decodeURIComponent(u.pathname.slice(1))],
    env,
  };
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { env, stdio: ['ignore', 'inherit', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} exited ${code}: ${err.trim()}`))));
  });
}

/**
 * The whole database (app tables and the job queue) in pg_dump's custom format, read as the owner
 * role. Roles and grants are left out: a restore gives every object to the restoring owner and then
 * grants the runtime role again.
 */
export async function backupDatabase(ownerUrl: string, file: string): Promise<void> {
  const c = connection(ownerUrl);
  await run(pgTool('pg_dump'), [...c.args, '--format=custom', '--no-owner', '--no-privileges', '--file', file], c.env);
}

/**
 * Restores a backup into the database at `ownerUrl` as the owner role. `clean` first drops the
 * objects the backup holds (restoring over an existing database); without it the database should be
 * empty. Afterwards pending migrations run (a backup from an older version) and the runtime role's
 * grants are renewed. Stop the servers first.
 */
export async function restoreDatabase(ownerUrl: string, file: string, opts: { clean?: boolean } = {}): Promise<void> {
  if (!existsSync(file)) throw new Error(`no such backup file: ${file}`);
  const c = connection(ownerUrl);
  const args = [...c.args, '--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error'];
  if (opts.clean) args.push('--clean', '--if-exists');
  await run(pgTool('pg_restore'), [...args, file], c.env);
  await migrateDatabase(ownerUrl);
  const ds = await createDataSource(ownerUrl).initialize();
  try {
    await grantRuntimeRole(ds);
  } finally {
    await ds.destroy();
  }
}
