import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The PT provider's profile (one row: name, address, contact, logo, accreditation, the person
 * who authorises reports, the subcontracting statement), printed on every report, certificate
 * and e-mail; and the coordinator's comments on a round, stored on its evaluation and printed
 * in the round report (ISO/IEC 17043 §7.4, recalled from memory).
 */
export class ProviderProfile1764900000600 implements MigrationInterface {
  name = 'ProviderProfile1764900000600';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE provider_profile (
        id integer PRIMARY KEY DEFAULT 1 CHECK (id = 1),
        name text NOT NULL DEFAULT '',
        address text NOT NULL DEFAULT '',
        contact_email text NOT NULL DEFAULT '',
        contact_phone text NOT NULL DEFAULT '',
        website text NOT NULL DEFAULT '',
        accreditation_body text NOT NULL DEFAULT '',
        accreditation_number text NOT NULL DEFAULT '',
        authoriser_name text NOT NULL DEFAULT '',
        authoriser_role text NOT NULL DEFAULT '',
        subcontracting text NOT NULL DEFAULT '',
        logo bytea,
        logo_type text CHECK (logo_type IN ('image/png', 'image/jpeg')),
        updated_at timestamptz NOT NULL DEFAULT now(),
        updated_by uuid REFERENCES app_user (id) ON DELETE SET NULL
      );
      ALTER TABLE evaluation ADD COLUMN coordinator_comments text NOT NULL DEFAULT '';
      -- The report cache holds files laid out before the provider's identity and the report
      -- clauses existed; they are rebuilt from the stored evaluations on the next request.
      DELETE FROM report;
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE evaluation DROP COLUMN coordinator_comments');
    await q.query('DROP TABLE provider_profile');
  }
}
