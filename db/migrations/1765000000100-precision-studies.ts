import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Precision studies (ISO 5725-2 round robins, rounds of kind 'precision'): the accepted reference
 * value of a level (test item × measurand), for the bias (ISO 5725-4), and the coordinator's
 * decisions on flagged cells or single replicates (set aside / kept, with a reason). Decisions are
 * never deleted: a newer one on the same target replaces it, or it is withdrawn with a reason.
 */
export class PrecisionStudies1765000000100 implements MigrationInterface {
  name = 'PrecisionStudies1765000000100';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE precision_reference (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        test_item_id uuid NOT NULL REFERENCES test_item (id) ON DELETE CASCADE,
        measurand_id uuid NOT NULL REFERENCES measurand (id) ON DELETE CASCADE,
        value double precision NOT NULL,
        u double precision CHECK (u IS NULL OR u > 0),
        source text NOT NULL,
        updated_by uuid REFERENCES app_user (id) ON DELETE SET NULL,
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (test_item_id, measurand_id)
      );
      CREATE INDEX precision_reference_round ON precision_reference (round_id);
      CREATE TABLE precision_exclusion (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        test_item_id uuid NOT NULL REFERENCES test_item (id) ON DELETE CASCADE,
        measurand_id uuid NOT NULL REFERENCES measurand (id) ON DELETE CASCADE,
        enrolment_id uuid NOT NULL REFERENCES enrolment (id) ON DELETE CASCADE,
        participant_code text NOT NULL,
        replicate integer CHECK (replicate IS NULL OR replicate BETWEEN 1 AND 20),
        kind text NOT NULL CHECK (kind IN ('straggler', 'outlier', 'other')),
        decision text NOT NULL CHECK (decision IN ('confirmed', 'rejected')),
        reason text NOT NULL,
        actor_id uuid REFERENCES app_user (id) ON DELETE SET NULL,
        at timestamptz NOT NULL DEFAULT clock_timestamp(),
        withdrawn_at timestamptz,
        withdrawn_by uuid REFERENCES app_user (id) ON DELETE SET NULL,
        withdrawn_reason text
      );
      CREATE INDEX precision_exclusion_round ON precision_exclusion (round_id, at);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE precision_exclusion');
    await q.query('DROP TABLE precision_reference');
  }
}
