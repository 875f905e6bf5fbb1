import 'reflect-metadata';
import { Client } from 'pg';
import { createDataSource, databaseUrl } from './data-source';
import { databaseName, maintenanceUrl } from './admin-url';
import { DEFAULT_DEMO_PASSWORD } from './seed/demo-people';
import { seedDemo } from './seed/demo';
import { buildTemplate, dropStaleTestDatabases } from './testing';

/**
 * npm run db:migrate | db:seed | db:reset   (tsx db/cli.ts migrate|seed|reset|template)
 * reset drops and recreates the app database, migrates and seeds the demo scenario.
 */
async function main(cmd: string | undefined): Promise<void> {
  const url = databaseUrl();
  const password = process.env['RINGLET_DEMO_PASSWORD'] || DEFAULT_DEMO_PASSWORD;
  switch (cmd) {
    case 'migrate': {
      const ds = await createDataSource(url).initialize();
      const done = await ds.runMigrations({ transaction: 'each' });
      console.log(`migrations applied: ${done.length}`);
      await ds.destroy();
      return;
    }
    case 'seed': {
      const ds = await createDataSource(url).initialize();
      await ds.runMigrations({ transaction: 'each' });
      await seedDemo(ds, password, process.env['PUBLIC_URL']);
      console.log('demo data loaded');
      await ds.destroy();
      return;
    }
    case 'reset': {
      const name = databaseName(url);
      const c = new Client({ connectionString: maintenanceUrl(url) });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.query(`CREATE DATABASE "${name}"`);
      await c.end();
      const ds = await createDataSource(url).initialize();
      await ds.runMigrations({ transaction: 'each' });
      await seedDemo(ds, password, process.env['PUBLIC_URL']);
      await ds.destroy();
      console.log(`database ${name} reset to the demo scenario`);
      return;
    }
    case 'template': {
      const stale = await dropStaleTestDatabases(url);
      await buildTemplate(url);
      console.log(`test template database ready${stale ? ` (dropped ${stale} stale test databases)` : ''}`);
      return;
    }
    default:
      console.error('usage: tsx db/cli.ts migrate|seed|reset|template');
      process.exit(2);
  }
}

main(process.argv[2]).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
