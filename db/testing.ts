import { randomBytes } from 'node:crypto';
import { Client } from 'pg';
import type { DataSource } from 'typeorm';
import { adminDatabaseUrl, createDataSource, databaseUrl, ownerDatabaseUrl } from './data-source';
import { maintenanceUrl, withDatabase } from './admin-url';
import { migrateDatabase } from './migrate';

/** Migrated, empty database that each test file clones (built once per `npm test`). */
export const TEMPLATE_DB = 'ringlet_template';

async function admin<T>(fn: (c: Client) => Promise<T>, url = adminDatabaseUrl()): Promise<T> {
  const c = new Client({ connectionString: maintenanceUrl(url) });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

/** ` OWNER "<owner role>"` when the admin connection is not the owner itself (so test databases belong to it). */
async function ownerClause(c: Client): Promise<string> {
  const owner = decodeURIComponent(new URL(ownerDatabaseUrl()).username);
  const { rows } = await c.query<{ me: string; has: boolean }>(
    `SELECT current_user AS me, EXISTS (SELECT 1 FROM pg_roles WHERE rolname = $1) AS has`,
    [owner],
  );
  return rows[0]!.has && rows[0]!.me !== owner ? ` OWNER "${owner.replace(/"/g, '""')}"` : '';
}

/** Drops and rebuilds the template database with every migration, as the owner role. */
export async function buildTemplate(): Promise<void> {
  await admin(async (c) => {
    await c.query(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
    await c.query(`CREATE DATABASE ${TEMPLATE_DB}${await ownerClause(c)}`);
  });
  await migrateDatabase(withDatabase(ownerDatabaseUrl(), TEMPLATE_DB));
}

export interface TestDatabase {
  /** Connected as the runtime role, like the server. */
  ds: DataSource;
  /** The runtime role's URL of this database. */
  url: string;
  /** The owner role's URL of this database (migrations, fixture set-up a server could not do). */
  ownerUrl: string;
  drop(): Promise<void>;
}

/** A fresh database for one test file, cloned from the template in a few tens of milliseconds. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const name = `ringlet_t_${randomBytes(6).toString('hex')}`;
  await admin(async (c) =>
    c.query(`CREATE DATABASE ${name} TEMPLATE ${TEMPLATE_DB}${await ownerClause(c)}`),
  );
  const dbUrl = withDatabase(databaseUrl(), name);
  const ds = createDataSource(dbUrl);
  await ds.initialize();
  return {
    ds,
    url: dbUrl,
    ownerUrl: withDatabase(ownerDatabaseUrl(), name),
    async drop() {
      if (ds.isInitialized) await ds.destroy();
      await admin((c) => c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`));
    },
  };
}

/** An empty database (no schema) owned by the owner role, e.g. to restore a backup into. */
export async function createEmptyDatabase(): Promise<Omit<TestDatabase, 'ds'>> {
  const name = `ringlet_t_${randomBytes(6).toString('hex')}`;
  await admin(async (c) =>
    c.query(`CREATE DATABASE ${name} TEMPLATE template0${await ownerClause(c)}`),
  );
  return {
    url: withDatabase(databaseUrl(), name),
    ownerUrl: withDatabase(ownerDatabaseUrl(), name),
    async drop() {
      await admin((c) => c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`));
    },
  };
}

/** Drops test databases left by interrupted runs. */
export async function dropStaleTestDatabases(): Promise<number> {
  return admin(async (c) => {
    const { rows } = await c.query<{ datname: string }>(
      `SELECT datname FROM pg_database WHERE datname LIKE 'ringlet\\_t\\_%'`,
    );
    for (const r of rows) await c.query(`DROP DATABASE IF EXISTS ${r.datname} WITH (FORCE)`);
    return rows.length;
  });
}
