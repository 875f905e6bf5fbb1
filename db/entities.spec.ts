import type { ColumnMetadata } from 'typeorm/metadata/ColumnMetadata';
import type { DataSource } from 'typeorm';
import { createDataSource } from './data-source';
import { entities } from './entities';
import { migrateDatabase } from './migrate';
import { createEmptyDatabase } from './testing';

jest.setTimeout(120_000);

interface DbColumn {
  table_name: string;
  column_name: string;
  data_type: string;
  is_nullable: 'YES' | 'NO';
  column_default: string | null;
}

/** TypeORM's normalised type as information_schema.columns.data_type spells it. */
function schemaType(ds: DataSource, c: ColumnMetadata): string {
  const t = ds.driver.normalizeType(c);
  const alias: Record<string, string> = {
    timestamptz: 'timestamp with time zone',
    timestamp: 'timestamp without time zone',
    int: 'integer',
    int4: 'integer',
    float8: 'double precision',
    bool: 'boolean',
    varchar: 'character varying',
  };
  return (alias[t] ?? t) + (c.isArray ? '[]' : '');
}

/**
 * The entities describe the schema the migrations build (synchronize is off, so nothing else
 * keeps them in step): every entity's table exists, and each mapped column has the same name,
 * type and nullability in information_schema.
 */
describe('db/entities match the migrations', () => {
  let db: Awaited<ReturnType<typeof createEmptyDatabase>>;
  let meta: DataSource;
  let columns: DbColumn[];

  beforeAll(async () => {
    // Built here from the migrations of this branch, like the template, so a stale template cannot hide a drift.
    db = await createEmptyDatabase();
    await migrateDatabase(db.ownerUrl);
    meta = createDataSource(db.ownerUrl);
    await meta.initialize();
    columns = (await meta.query(
      `SELECT table_name, column_name, is_nullable, column_default,
              CASE WHEN data_type = 'ARRAY' THEN substr(udt_name, 2) || '[]' ELSE data_type END AS data_type
       FROM information_schema.columns WHERE table_schema = 'public'`,
    )) as DbColumn[];
  });
  afterAll(async () => {
    if (meta?.isInitialized) await meta.destroy();
    await db?.drop();
  });

  it('registers every entity in the index', () => {
    expect(meta.entityMetadatas.map((m) => m.target)).toEqual(expect.arrayContaining(entities));
    expect(meta.entityMetadatas).toHaveLength(entities.length);
  });

  it.each(entities.map((e) => [e.name, e] as const))(
    '%s: table and columns (name, type, nullability)',
    (_name, entity) => {
      const m = meta.getMetadata(entity);
      const inDb = columns.filter((c) => c.table_name === m.tableName);
      expect(inDb.length).toBeGreaterThan(0);
      const fromEntity = m.columns
        .map((c) => ({
          column: c.databaseName,
          type: schemaType(meta, c),
          nullable: c.isNullable,
        }))
        .sort((a, b) => a.column.localeCompare(b.column));
      const fromDb = fromEntity.map(({ column }) => {
        const c = inDb.find((d) => d.column_name === column);
        return c
          ? { column, type: c.data_type, nullable: c.is_nullable === 'YES' }
          : { column, type: 'missing in the migrations', nullable: false };
      });
      expect(fromEntity).toEqual(fromDb);
    },
  );

  it.each(entities.map((e) => [e.name, e] as const))(
    '%s: a column the entity leaves out has a default or accepts null (inserts through the entity work)',
    (_name, entity) => {
      const m = meta.getMetadata(entity);
      const mapped = new Set(m.columns.map((c) => c.databaseName));
      const unmappedRequired = columns
        .filter((c) => c.table_name === m.tableName && !mapped.has(c.column_name))
        .filter((c) => c.is_nullable === 'NO' && c.column_default === null)
        .map((c) => c.column_name);
      expect(unmappedRequired).toEqual([]);
    },
  );
});
