import type { DataSource } from 'typeorm';
import { createDataSource } from './data-source';
import { JOB_SCHEMA, jobSchemaIsCurrent, migrateDatabase } from './migrate';
import { createTestDatabase, type TestDatabase } from './testing';

jest.setTimeout(120_000);

/** A server start skips installing pg-boss's schema only when it is there at the wanted version. */
describe('the job queue schema check at start-up', () => {
  let db: TestDatabase;
  let ds: DataSource;

  beforeAll(async () => {
    db = await createTestDatabase();
    ds = await createDataSource(db.ownerUrl).initialize();
  });
  afterAll(async () => {
    await ds.destroy();
    await db.drop();
  });

  it('is current on a migrated database, and not when older or missing', async () => {
    expect(await jobSchemaIsCurrent(ds)).toBe(true);
    await ds.query(`UPDATE ${JOB_SCHEMA}.version SET version = version - 1`);
    expect(await jobSchemaIsCurrent(ds)).toBe(false);
    await ds.query(`UPDATE ${JOB_SCHEMA}.version SET version = version + 1`);
    await ds.query(`ALTER TABLE ${JOB_SCHEMA}.version RENAME TO version_kept`);
    expect(await jobSchemaIsCurrent(ds)).toBe(false);
    await ds.query(`ALTER TABLE ${JOB_SCHEMA}.version_kept RENAME TO version`);
  });

  it('migrating a migrated database again changes nothing', async () => {
    expect(await migrateDatabase(db.ownerUrl)).toBe(0);
    expect(await jobSchemaIsCurrent(ds)).toBe(true);
  });
});
