import { randomBytes } from 'node:crypto';
import { Client } from 'pg';
import type { DataSource } from 'typeorm';
import { createDataSource, databaseUrl } from './data-source';
import { maintenanceUrl, withDatabase } from './admin-url';

/** Migrated, empty database that each test file clones (built once per `npm test`). */
export const TEMPLATE_DB = 'ringlet_template';

async function admin<T>(url: string, fn: (c: Client) => Promise<T>): Promise<T> {
  const c = new Client({ connectionString: maintenanceUrl(url) });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

/** Drops and rebuilds the template database with every migration. */
export async function buildTemplate(url = databaseUrl()): Promise<void> {
  await admin(url, async (c) => {
    await c.query(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
    await c.query(`CREATE DATABASE ${TEMPLATE_DB}`);
  });
  const ds = createDataSource(withDatabase(url, TEMPLATE_DB));
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  await ds.destroy();
}

export interface TestDatabase {
  ds: DataSource;
  url: string;
  drop(): Promise<void>;
}

/** A fresh database for one test file, cloned from the template in a few tens of milliseconds. */
export async function createTestDatabase(url = databaseUrl()): Promise<TestDatabase> {
  const name = `ringlet_t_${randomBytes(6).toString('hex')}`;
  await admin(url, (c) => c.query(`CREATE DATABASE ${name} TEMPLATE ${TEMPLATE_DB}`));
  const dbUrl = withDatabase(url, name);
  const ds = createDataSource(dbUrl);
  await ds.initialize();
  return {
    ds,
    url: dbUrl,
    async drop() {
      if (ds.isInitialized) await ds.destroy();
      await admin(url, (c) => c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`));
    },
  };
}

/** Drops test databases left by interrupted runs. */
export async function dropStaleTestDatabases(url = databaseUrl()): Promise<number> {
  return admin(url, async (c) => {
    const { rows } = await c.query<{ datname: string }>(`SELECT datname FROM pg_database WHERE datname LIKE 'ringlet\\_t\\_%'`);
    for (const r of rows) await c.query(`DROP DATABASE IF EXISTS ${r.datname} WITH (FORCE)`);
    return rows.length;
  });
}
