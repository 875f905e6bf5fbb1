import { Client as PgClient } from 'pg';
import { buildEvaluationFixture } from '../api/src/testing/evaluation-fixtures';
import { publishAsCoordinator, startTestApp, type TestApp } from '../api/src/testing/test-app';
import { databaseUrl, ownerDatabaseUrl, RUNTIME_ROLE } from './data-source';

jest.setTimeout(120_000);

/**
 * The server's database role (the runtime role the test app runs as, like the server) holds data
 * rights only: it cannot switch off the guards that keep submitted results and published
 * evaluations append-only, nor change the schema.
 */
describe('database roles: the server cannot alter submitted or published results', () => {
  let t: TestApp;
  let roundId: string;

  beforeAll(async () => {
    t = await startTestApp();
    const fx = await buildEvaluationFixture(t.ds, { participants: 6 });
    roundId = fx.round.id;
    await publishAsCoordinator(t, roundId, 'coord@roles.test');
  });
  afterAll(() => t.close());

  const q = (sql: string, params: unknown[] = []) => t.ds.query(sql, params);
  const versions = async () =>
    (await q(
      `SELECT sv.id, sv.data::text AS data, sv.submitted_at FROM submission_version sv
       JOIN submission s ON s.id = sv.submission_id JOIN enrolment e ON e.id = s.enrolment_id
       WHERE e.round_id = $1 ORDER BY sv.id`,
      [roundId],
    )) as { id: string; data: string; submitted_at: Date }[];

  it('runs the app as the runtime role, which is no superuser and may not create objects', async () => {
    expect(new URL(databaseUrl()).username).toBe(RUNTIME_ROLE);
    const [me] = await q(
      `SELECT current_user AS name, r.rolsuper, r.rolcreatedb, r.rolcreaterole, r.rolbypassrls,
              has_schema_privilege('public', 'CREATE') AS can_create
       FROM pg_roles r WHERE r.rolname = current_user`,
    );
    expect(me).toEqual({
      name: RUNTIME_ROLE,
      rolsuper: false,
      rolcreatedb: false,
      rolcreaterole: false,
      rolbypassrls: false,
      can_create: false,
    });
    await expect(q(`CREATE TABLE public.sneaky (x int)`)).rejects.toThrow(/permission denied/);
    await expect(q(`DROP TABLE submission_version`)).rejects.toThrow(/must be owner/);
  });

  it('cannot change, delete or truncate a submitted version of results', async () => {
    const before = await versions();
    expect(before.length).toBeGreaterThanOrEqual(6);
    await expect(
      q(`UPDATE submission_version SET data = '{}'::jsonb WHERE id = $1`, [before[0]!.id]),
    ).rejects.toThrow(/immutable/);
    await expect(
      q(`UPDATE submission_version SET submitted_at = now() - interval '1 year'`),
    ).rejects.toThrow(/immutable/);
    await expect(
      q(`DELETE FROM submission_version WHERE id = $1`, [before[0]!.id]),
    ).rejects.toThrow(/immutable/);
    await expect(q(`TRUNCATE submission_version CASCADE`)).rejects.toThrow(
      /permission denied|immutable/,
    );
    expect(await versions()).toEqual(before);
  });

  it('cannot switch the guards off', async () => {
    for (const [table, trigger] of [
      ['submission_version', 'submission_version_no_change'],
      ['evaluation', 'evaluation_published_immutable'],
      ['evaluation_result', 'evaluation_result_immutable'],
      ['audit_event', 'audit_event_no_change'],
    ] as const) {
      await expect(q(`ALTER TABLE ${table} DISABLE TRIGGER ${trigger}`)).rejects.toThrow(
        /must be owner/,
      );
      await expect(q(`ALTER TABLE ${table} DISABLE TRIGGER ALL`)).rejects.toThrow(/must be owner/);
      await expect(q(`DROP TRIGGER ${trigger} ON ${table}`)).rejects.toThrow(/must be owner/);
    }
    await expect(q(`SET session_replication_role = replica`)).rejects.toThrow(/permission denied/);
    await expect(
      q(
        `CREATE OR REPLACE FUNCTION submission_version_append_only() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$`,
      ),
    ).rejects.toThrow(/must be owner|permission denied/);
  });

  it('cannot change or delete a published evaluation or its results', async () => {
    const [before] = await q(
      `SELECT id, state, published_at, board::text AS board FROM evaluation WHERE round_id = $1 AND state = 'published'`,
      [roundId],
    );
    expect(before.state).toBe('published');
    await expect(
      q(`UPDATE evaluation SET published_at = now() - interval '1 year' WHERE id = $1`, [
        before.id,
      ]),
    ).rejects.toThrow(/immutable/);
    await expect(q(`DELETE FROM evaluation WHERE id = $1`, [before.id])).rejects.toThrow(
      /immutable/,
    );
    await expect(
      q(
        `UPDATE evaluation_result SET assigned_value = assigned_value * 2 WHERE evaluation_id = $1`,
        [before.id],
      ),
    ).rejects.toThrow(/immutable/);
    await expect(
      q(`DELETE FROM evaluation_result WHERE evaluation_id = $1`, [before.id]),
    ).rejects.toThrow(/immutable/);
    await expect(q(`TRUNCATE evaluation CASCADE`)).rejects.toThrow(
      /permission denied|cannot be truncated/,
    );
    const [after] = await q(
      `SELECT id, state, published_at, board::text AS board FROM evaluation WHERE id = $1`,
      [before.id],
    );
    expect(after).toEqual(before);
  });

  it('the owner role (migrations) can switch a guard off: the difference is the role, not the table', async () => {
    const owner = new PgClient({ connectionString: t.db.ownerUrl });
    await owner.connect();
    try {
      expect(new URL(ownerDatabaseUrl()).username).not.toBe(RUNTIME_ROLE);
      await owner.query('BEGIN');
      await owner.query(
        `ALTER TABLE submission_version DISABLE TRIGGER submission_version_no_change`,
      );
      const r = await owner.query(
        `UPDATE submission_version SET note = 'owner' WHERE id IN (SELECT id FROM submission_version LIMIT 1)`,
      );
      expect(r.rowCount).toBe(1);
      await owner.query('ROLLBACK');
    } finally {
      await owner.end();
    }
    expect((await versions()).some((v) => v.data === null)).toBe(false);
    const [{ n }] = await q(
      `SELECT count(*)::int AS n FROM submission_version WHERE note = 'owner'`,
    );
    expect(n).toBe(0);
  });
});
