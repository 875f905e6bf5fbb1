import { readFileSync } from 'node:fs';
import PgBoss from 'pg-boss';
import type { DataSource } from 'typeorm';
import { createDataSource, ownerDatabaseUrl, RUNTIME_ROLE } from './data-source';

/** pg-boss's schema (the job queue; api/src/jobs/queue.ts uses the default). */
export const JOB_SCHEMA = 'pgboss';

/**
 * Brings a database up to date, as the owner role: every pending migration, the job queue's own
 * schema (pg-boss installs and upgrades it itself, which needs DDL rights the server does not have),
 * then the runtime role's grants. Idempotent; the server, `db:migrate` and the test template run it.
 */
export async function migrateDatabase(ownerUrl = ownerDatabaseUrl()): Promise<number> {
  const ds = await createDataSource(ownerUrl).initialize();
  // Several instances starting at once: one migrates, the others wait on this lock and find nothing to do.
  const lock = ds.createQueryRunner();
  try {
    await lock.connect();
    await lock.query(`SELECT pg_advisory_lock(${MIGRATION_LOCK})`);
    const done = await ds.runMigrations({ transaction: 'each' });
    // Starting a pg-boss instance to install its schema costs a pool and several round trips at
    // every server start; skip it when the installed schema is the one this pg-boss wants.
    if (!(await jobSchemaIsCurrent(ds))) await installJobSchema(ownerUrl);
    await grantRuntimeRole(ds);
    return done.length;
  } finally {
    await lock.query(`SELECT pg_advisory_unlock(${MIGRATION_LOCK})`).catch(() => undefined);
    await lock.release();
    await ds.destroy();
  }
}

/** Advisory lock key held while migrating (an arbitrary constant: "ringlet" in ASCII, 0x72696e676c6574). */
const MIGRATION_LOCK = '32204070247490932';

/** Whether pg-boss's schema is installed at the version the installed pg-boss package expects. */
export async function jobSchemaIsCurrent(ds: DataSource): Promise<boolean> {
  const wanted = (
    JSON.parse(readFileSync(require.resolve('pg-boss/version.json'), 'utf8')) as { schema: number }
  ).schema;
  const [table] = (await ds.query(`SELECT to_regclass($1) AS t`, [`${JOB_SCHEMA}.version`])) as {
    t: string | null;
  }[];
  if (!table?.t) return false;
  const rows = (await ds.query(`SELECT version FROM ${JOB_SCHEMA}.version`)) as {
    version: string | number;
  }[];
  return rows.length === 1 && Number(rows[0]!.version) === wanted;
}

/** Installs or upgrades pg-boss's schema without starting its maintenance or cron. */
export async function installJobSchema(ownerUrl: string): Promise<void> {
  const boss = new PgBoss({
    connectionString: ownerUrl,
    schema: JOB_SCHEMA,
    max: 1,
    supervise: false,
    schedule: false,
  });
  boss.on('error', () => undefined);
  await boss.start();
  await boss.stop({ graceful: false, wait: true, timeout: 1000 });
}

/**
 * The runtime role's rights: data only (SELECT, INSERT, UPDATE, DELETE on tables; sequences), now
 * and for tables later migrations add (default privileges of the owner). The append-only tables
 * (audit trail, submitted versions, published evaluations) are guarded by triggers, which only the
 * owner could switch off. pg-boss creates one table per new queue in
 * `create_queue`; that function runs with its owner's rights (SECURITY DEFINER), so the server can
 * add a queue without holding DDL rights itself. Skipped when the runtime role does not exist
 * (a single-role deployment).
 */
export async function grantRuntimeRole(ds: DataSource, role = RUNTIME_ROLE): Promise<boolean> {
  const exists: unknown[] = await ds.query(`SELECT 1 FROM pg_roles WHERE rolname = $1`, [role]);
  const me: { current_user: string }[] = await ds.query(`SELECT current_user`);
  if (exists.length === 0 || me[0]?.current_user === role) return false;
  const r = `"${role.replace(/"/g, '""')}"`;
  await ds.query(
    `GRANT CONNECT ON DATABASE "${(await currentDatabase(ds)).replace(/"/g, '""')}" TO ${r}`,
  );
  for (const schema of ['public', JOB_SCHEMA]) {
    const has: unknown[] = await ds.query(`SELECT 1 FROM pg_namespace WHERE nspname = $1`, [
      schema,
    ]);
    if (has.length === 0) continue;
    await ds.query(`
      GRANT USAGE ON SCHEMA ${schema} TO ${r};
      GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${schema} TO ${r};
      GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA ${schema} TO ${r};
      GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA ${schema} TO ${r};
      ALTER DEFAULT PRIVILEGES IN SCHEMA ${schema} GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${r};
      ALTER DEFAULT PRIVILEGES IN SCHEMA ${schema} GRANT USAGE, SELECT ON SEQUENCES TO ${r};
    `);
  }
  const createQueue: unknown[] = await ds.query(
    `SELECT 1 FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
    WHERE n.nspname = $1 AND p.proname = 'create_queue'`,
    [JOB_SCHEMA],
  );
  if (createQueue.length) {
    await ds.query(
      `ALTER FUNCTION ${JOB_SCHEMA}.create_queue(text, json) SECURITY DEFINER SET search_path = pg_catalog, pg_temp`,
    );
    await ds.query(
      `ALTER FUNCTION ${JOB_SCHEMA}.delete_queue(text) SECURITY DEFINER SET search_path = pg_catalog, pg_temp`,
    );
  }
  return true;
}

async function currentDatabase(ds: DataSource): Promise<string> {
  const rows: { db: string }[] = await ds.query(`SELECT current_database() AS db`);
  return rows[0]!.db;
}
