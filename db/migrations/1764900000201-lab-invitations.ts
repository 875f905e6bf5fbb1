import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A lab's invitation to an existing account: the membership exists only once the person accepts.
 * At most one open invitation per lab and person.
 */
export class LabInvitations1764900000201 implements MigrationInterface {
  name = 'LabInvitations1764900000201';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE lab_invitation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organisation_id uuid NOT NULL REFERENCES organisation (id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        is_manager boolean NOT NULL DEFAULT false,
        invited_by uuid REFERENCES app_user (id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        expires_at timestamptz NOT NULL,
        answered_at timestamptz,
        answer text CHECK (answer IN ('accepted', 'declined', 'withdrawn')),
        CHECK ((answered_at IS NULL) = (answer IS NULL))
      );
      CREATE UNIQUE INDEX lab_invitation_open ON lab_invitation (organisation_id, user_id) WHERE answered_at IS NULL;
      CREATE INDEX lab_invitation_user ON lab_invitation (user_id) WHERE answered_at IS NULL;
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE lab_invitation');
  }
}
