import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Built report files (round workbook and PDFs, individual reports, certificates, evidence
 * packs): the cache every server instance shares, and the status of background builds.
 * A file is keyed by round, kind, lab (for lab-specific files) and evaluation version.
 */
export class Reports1764651600000 implements MigrationInterface {
  name = 'Reports1764651600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE report (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid REFERENCES round (id) ON DELETE CASCADE,
        kind text NOT NULL CHECK (kind IN ('round.xlsx', 'round.pdf', 'participant.pdf', 'certificate.pdf', 'evidence.zip')),
        organisation_id uuid REFERENCES organisation (id) ON DELETE CASCADE,
        evaluation_id uuid REFERENCES evaluation (id) ON DELETE CASCADE,
        evaluation_version integer,
        status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'running', 'done', 'failed')),
        progress integer NOT NULL DEFAULT 0 CHECK (progress BETWEEN 0 AND 100),
        file bytea,
        sha256 text,
        size_bytes integer,
        error text,
        requested_by uuid REFERENCES app_user (id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        finished_at timestamptz
      );
      -- One file per round × kind × lab × evaluation version (lab-less files use the nil uuid).
      CREATE UNIQUE INDEX report_cache_key ON report (
        coalesce(round_id, '00000000-0000-0000-0000-000000000000'::uuid), kind,
        coalesce(organisation_id, '00000000-0000-0000-0000-000000000000'::uuid),
        coalesce(evaluation_version, 0)
      );
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE report');
  }
}
