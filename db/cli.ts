import 'reflect-metadata';
import { Client } from 'pg';
import { adminDatabaseUrl, createDataSource, OWNER_ROLE, ownerDatabaseUrl } from './data-source';
import { databaseName, maintenanceUrl } from './admin-url';
import { backupDatabase, restoreDatabase } from './backup';
import { migrateDatabase } from './migrate';
import { DEFAULT_DEMO_PASSWORD } from './seed/demo-people';
import { seedDemo } from './seed/demo';
import { buildTemplate, dropStaleTestDatabases } from './testing';

/**
 * npm run db:migrate | db:seed | db:reset | db:backup [FILE] | db:restore FILE
 *   (tsx db/cli.ts migrate|seed|reset|template|backup|restore)
 * Everything runs as the owner role (DATABASE_OWNER_URL, or the local cluster's ringlet_owner);
 * reset drops and recreates the app database (admin connection), migrates and seeds the demo scenario.
 */
async function main(cmd: string | undefined, arg: string | undefined): Promise<void> {
  const url = ownerDatabaseUrl();
  const password = process.env['RINGLET_DEMO_PASSWORD'] || DEFAULT_DEMO_PASSWORD;
  switch (cmd) {
    case 'migrate': {
      console.log(`migrations applied: ${await migrateDatabase(url)}`);
      return;
    }
    case 'seed': {
      await migrateDatabase(url);
      const ds = await createDataSource(url).initialize();
      await seedDemo(ds, password, process.env['PUBLIC_URL']);
      console.log('demo data loaded');
      await ds.destroy();
      return;
    }
    case 'reset': {
      const name = databaseName(url);
      const c = new Client({ connectionString: maintenanceUrl(adminDatabaseUrl()) });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      const owner = await c.query(
        `SELECT 1 FROM pg_roles WHERE rolname = $1 AND rolname <> current_user`,
        [OWNER_ROLE],
      );
      await c.query(`CREATE DATABASE "${name}"${owner.rowCount ? ` OWNER ${OWNER_ROLE}` : ''}`);
      await c.end();
      await migrateDatabase(url);
      const ds = await createDataSource(url).initialize();
      await seedDemo(ds, password, process.env['PUBLIC_URL']);
      await ds.destroy();
      console.log(`database ${name} reset to the demo scenario`);
      return;
    }
    case 'template': {
      const stale = await dropStaleTestDatabases();
      await buildTemplate();
      console.log(
        `test template database ready${stale ? ` (dropped ${stale} stale test databases)` : ''}`,
      );
      return;
    }
    case 'backup': {
      const file =
        arg ||
        `ringlet-${new Date().toISOString().slice(0, 19).replace(/[-:]/g, '').replace('T', '-')}.dump`;
      await backupDatabase(url, file);
      console.log(
        `backup of ${databaseName(url)} written to ${file} (restore: npm run db:restore ${file})`,
      );
      return;
    }
    case 'restore': {
      if (!arg) throw new Error('usage: npm run db:restore FILE (stop the servers first)');
      await restoreDatabase(url, arg);
      console.log(`database ${databaseName(url)} restored from ${arg}`);
      return;
    }
    case undefined:
    default:
      console.error('usage: tsx db/cli.ts migrate|seed|reset|template|backup [FILE]|restore FILE');
      process.exit(2);
  }
}

main(process.argv[2], process.argv[3]).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
