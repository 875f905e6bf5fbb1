import { spawn } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { migrateDatabase } from './migrate';

/** pg_dump / pg_restore / psql: the newest Debian PostgreSQL install first (db/postgres.sh uses the same), else PATH. */
export function pgTool(name: 'pg_dump' | 'pg_restore' | 'psql'): string {
  const root = '/usr/lib/postgresql';
  if (existsSync(root)) {
    const versions = readdirSync(root)
      .filter((v) => /^\d+$/.test(v))
      .sort((a, b) => Number(b) - Number(a));
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
    args: [
      '-h',
      u.hostname,
      '-p',
      u.port || '5432',
      '-U',
      decodeURIComponent(u.username),
      '-d',
      decodeURIComponent(u.pathname.slice(1)),
    ],
    env,
  };
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { env, stdio: ['ignore', 'inherit', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    child.on('error', reject);
    child.on('exit', (code) =>
      code === 0 ? resolve() : reject(new Error(`${cmd} exited ${code}: ${err.trim()}`)),
    );
  });
}

/**
 * The whole database (app tables and the job queue) in pg_dump's custom format, read as the owner
 * role. Roles and grants are left out: a restore gives every object to the restoring owner and then
 * grants the runtime role again.
 */
export async function backupDatabase(ownerUrl: string, file: string): Promise<void> {
  const c = connection(ownerUrl);
  await run(
    pgTool('pg_dump'),
    [...c.args, '--format=custom', '--no-owner', '--no-privileges', '--file', file],
    c.env,
  );
}

/**
 * Restores a backup into the database at `ownerUrl` as the owner role, in one transaction: the
 * app's schemas (public, and pgboss for the job queue) are dropped and rebuilt from the backup, so
 * either the whole backup is in place or nothing changed. Afterwards pending migrations run (a
 * backup from an older version) and the runtime role's grants are renewed. Stop the servers first.
 */
export async function restoreDatabase(ownerUrl: string, file: string): Promise<void> {
  if (!existsSync(file)) throw new Error(`no such backup file: ${file}`);
  const c = connection(ownerUrl);
  // pg_restore writes the restore as SQL; psql runs it after the drop inside one transaction, which
  // is committed only when pg_restore read the whole file (else psql is killed: nothing changes).
  const psql = spawn(
    pgTool('psql'),
    [...c.args, '--quiet', '-v', 'ON_ERROR_STOP=1', '--file', '-'],
    {
      env: c.env,
      stdio: ['pipe', 'ignore', 'pipe'],
    },
  );
  const restore = spawn(
    pgTool('pg_restore'),
    ['--no-owner', '--no-privileges', '--file', '-', file],
    { env: c.env, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let err = '';
  psql.stderr!.on('data', (d: Buffer) => (err += d.toString()));
  restore.stderr!.on('data', (d: Buffer) => (err += d.toString()));
  const exited = (p: ReturnType<typeof spawn>) =>
    new Promise<number>((resolve, reject) => {
      p.on('error', reject);
      p.on('exit', (code) => resolve(code ?? 1));
    });
  const psqlDone = exited(psql);
  psql.stdin!.on('error', () => undefined); // psql stopped on an error: its exit code tells
  psql.stdin!.write(
    'BEGIN;\nDROP SCHEMA IF EXISTS pgboss CASCADE;\nDROP SCHEMA IF EXISTS public CASCADE;\nCREATE SCHEMA public;\n',
  );
  restore.stdout!.pipe(psql.stdin!, { end: false });
  const restoreCode = await exited(restore);
  await new Promise<void>((resolve) =>
    restore.stdout!.readableEnded ? resolve() : restore.stdout!.once('end', () => resolve()),
  );
  if (restoreCode !== 0) {
    psql.kill('SIGKILL');
    await psqlDone;
    throw new Error(`pg_restore exited ${restoreCode} (the database is unchanged): ${err.trim()}`);
  }
  psql.stdin!.end('COMMIT;\n');
  const psqlCode = await psqlDone;
  if (psqlCode !== 0) throw new Error(`restore failed (the database is unchanged): ${err.trim()}`);
  await migrateDatabase(ownerUrl); // also renews the runtime role's grants
}
