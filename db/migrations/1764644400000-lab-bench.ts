import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Lab bench: instrument checks (history per instrument), submission attachments stored in
 * PostgreSQL (so every server instance sees them), idempotent submits.
 */
export class LabBench1764644400000 implements MigrationInterface {
  name = 'LabBench1764644400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE instrument_check (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organisation_id uuid NOT NULL REFERENCES organisation (id),
        instrument text NOT NULL,
        material text NOT NULL,
        reference_value_nm double precision NOT NULL CHECK (reference_value_nm > 0),
        tolerance_nm double precision NOT NULL CHECK (tolerance_nm > 0),
        pdi_limit double precision NOT NULL CHECK (pdi_limit > 0 AND pdi_limit <= 1),
        set_point_c double precision NOT NULL,
        temperature_tolerance_c double precision NOT NULL CHECK (temperature_tolerance_c > 0),
        min_equilibration_min double precision NOT NULL CHECK (min_equilibration_min >= 0),
        runs jsonb NOT NULL,
        passed boolean NOT NULL,
        verdict jsonb NOT NULL,
        notes text NOT NULL DEFAULT '',
        checked_at timestamptz NOT NULL,
        recorded_by uuid REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX instrument_check_lab_idx ON instrument_check (organisation_id, lower(instrument), checked_at DESC);

      CREATE TABLE attachment (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        submission_id uuid NOT NULL REFERENCES submission (id) ON DELETE CASCADE,
        test_item_id uuid REFERENCES test_item (id),
        file_name text NOT NULL,
        content_type text NOT NULL,
        kind text NOT NULL CHECK (kind IN ('correlation-csv', 'text', 'pdf', 'xlsx')),
        size_bytes integer NOT NULL CHECK (size_bytes > 0 AND size_bytes <= 20971520),
        sha256 text NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
        data bytea NOT NULL,
        reanalysis jsonb,
        uploaded_by uuid REFERENCES app_user (id),
        uploaded_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX attachment_submission_idx ON attachment (submission_id, uploaded_at);

      ALTER TABLE submission_version
        ADD COLUMN idempotency_key text,
        ADD COLUMN is_late boolean NOT NULL DEFAULT false,
        ADD COLUMN instrument_check_id uuid REFERENCES instrument_check (id);
      CREATE UNIQUE INDEX submission_version_idempotency ON submission_version (submission_id, idempotency_key)
        WHERE idempotency_key IS NOT NULL;
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP INDEX submission_version_idempotency;
      ALTER TABLE submission_version
        DROP COLUMN instrument_check_id,
        DROP COLUMN is_late,
        DROP COLUMN idempotency_key;
      DROP TABLE attachment;
      DROP TABLE instrument_check;
    `);
  }
}
