import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Round desk: homogeneity and stability studies of a round's test items, and the log of reminder
 * e-mails (one row per round × enrolment × kind, so several server instances never send one twice).
 */
export class RoundDesk1764640800000 implements MigrationInterface {
  name = 'RoundDesk1764640800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE homogeneity_study (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        test_item_id uuid NOT NULL REFERENCES test_item (id) ON DELETE CASCADE,
        measurand_id uuid NOT NULL REFERENCES measurand (id) ON DELETE CASCADE,
        kind text NOT NULL CHECK (kind IN ('homogeneity', 'stability')),
        sigma_pt double precision NOT NULL CHECK (sigma_pt > 0),
        data jsonb NOT NULL,
        result jsonb NOT NULL,
        passes boolean NOT NULL,
        decision text CHECK (decision IN ('accept', 'widen-sigma-pt', 'exclude-item')),
        decision_reason text,
        decided_by uuid REFERENCES app_user (id),
        decided_at timestamptz,
        created_by uuid REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT homogeneity_study_unique UNIQUE (round_id, test_item_id, measurand_id, kind)
      );

      CREATE TABLE reminder_log (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        enrolment_id uuid NOT NULL REFERENCES enrolment (id) ON DELETE CASCADE,
        kind text NOT NULL CHECK (kind IN ('due-soon', 'overdue')),
        sent_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT reminder_log_once UNIQUE (round_id, enrolment_id, kind)
      );
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE reminder_log;
      DROP TABLE homogeneity_study;
    `);
  }
}
