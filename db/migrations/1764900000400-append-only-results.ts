import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Submitted results are append-only: a submitted version of a lab's results never changes or
 * disappears (a correction is a new version). Published evaluations already refuse changes
 * row by row (1764648000000-evaluation); this adds the TRUNCATE guard to them and to the
 * submitted versions. Only the table owner (the migration role) can switch these triggers off;
 * the server's runtime role cannot (README, "Database roles").
 */
export class AppendOnlyResults1764900000400 implements MigrationInterface {
  name = 'AppendOnlyResults1764900000400';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE FUNCTION submission_version_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'a submitted version of results is immutable (submit a new version instead)';
      END $$;
      CREATE TRIGGER submission_version_no_change BEFORE UPDATE OR DELETE ON submission_version
        FOR EACH ROW EXECUTE FUNCTION submission_version_append_only();
      CREATE TRIGGER submission_version_no_truncate BEFORE TRUNCATE ON submission_version
        FOR EACH STATEMENT EXECUTE FUNCTION submission_version_append_only();

      CREATE FUNCTION published_results_no_truncate() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% holds published results and cannot be truncated', TG_TABLE_NAME;
      END $$;
      CREATE TRIGGER evaluation_no_truncate BEFORE TRUNCATE ON evaluation
        FOR EACH STATEMENT EXECUTE FUNCTION published_results_no_truncate();
      CREATE TRIGGER evaluation_result_no_truncate BEFORE TRUNCATE ON evaluation_result
        FOR EACH STATEMENT EXECUTE FUNCTION published_results_no_truncate();
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TRIGGER evaluation_result_no_truncate ON evaluation_result;
      DROP TRIGGER evaluation_no_truncate ON evaluation;
      DROP FUNCTION published_results_no_truncate();
      DROP TRIGGER submission_version_no_truncate ON submission_version;
      DROP TRIGGER submission_version_no_change ON submission_version;
      DROP FUNCTION submission_version_append_only();
    `);
  }
}
