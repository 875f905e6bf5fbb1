import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Round evaluations (versioned, immutable once published), their per item × measurand results,
 * investigations opened by warning and action signals, and assessor access grants.
 */
export class Evaluation1764648000000 implements MigrationInterface {
  name = 'Evaluation1764648000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE evaluation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        version integer NOT NULL CHECK (version >= 1),
        state text NOT NULL DEFAULT 'draft' CHECK (state IN ('draft', 'committed', 'published')),
        settings jsonb NOT NULL DEFAULT '{}',
        software_version text NOT NULL,
        reissue_reason text,
        board jsonb NOT NULL DEFAULT '{}',
        computed_at timestamptz NOT NULL DEFAULT now(),
        created_by uuid REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now(),
        committed_at timestamptz,
        published_at timestamptz,
        CONSTRAINT evaluation_round_version UNIQUE (round_id, version)
      );
      -- At most one draft per round.
      CREATE UNIQUE INDEX evaluation_one_draft ON evaluation (round_id) WHERE state = 'draft';
      CREATE INDEX evaluation_round_idx ON evaluation (round_id, version DESC);

      CREATE TABLE evaluation_result (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        evaluation_id uuid NOT NULL REFERENCES evaluation (id) ON DELETE CASCADE,
        test_item_id uuid NOT NULL REFERENCES test_item (id),
        measurand_id uuid NOT NULL REFERENCES measurand (id),
        item_code text NOT NULL,
        measurand_key text NOT NULL,
        n integer NOT NULL,
        assigned_value double precision,
        u_assigned double precision,
        sigma_pt double precision,
        method text NOT NULL,
        constants jsonb NOT NULL DEFAULT '{}',
        iterations integer NOT NULL DEFAULT 0,
        warnings jsonb NOT NULL DEFAULT '[]',
        inputs jsonb NOT NULL DEFAULT '[]',
        participants jsonb NOT NULL DEFAULT '[]',
        CONSTRAINT evaluation_result_unique UNIQUE (evaluation_id, test_item_id, measurand_id)
      );

      -- Published evaluations never change in place (docs/QUALITY.md: a correction is a new version).
      CREATE FUNCTION evaluation_refuse_published_change() RETURNS trigger AS $$
      BEGIN
        IF OLD.state = 'published' THEN
          RAISE EXCEPTION 'a published evaluation is immutable (reissue it instead)';
        END IF;
        IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
        RETURN NEW;
      END $$ LANGUAGE plpgsql;
      CREATE TRIGGER evaluation_published_immutable BEFORE UPDATE OR DELETE ON evaluation
        FOR EACH ROW EXECUTE FUNCTION evaluation_refuse_published_change();

      CREATE FUNCTION evaluation_result_refuse_published_change() RETURNS trigger AS $$
      BEGIN
        IF EXISTS (SELECT 1 FROM evaluation e WHERE e.id = OLD.evaluation_id AND e.state IN ('committed', 'published')) THEN
          RAISE EXCEPTION 'results of a committed or published evaluation are immutable';
        END IF;
        IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
        RETURN NEW;
      END $$ LANGUAGE plpgsql;
      CREATE TRIGGER evaluation_result_immutable BEFORE UPDATE OR DELETE ON evaluation_result
        FOR EACH ROW EXECUTE FUNCTION evaluation_result_refuse_published_change();

      CREATE TABLE investigation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        enrolment_id uuid NOT NULL REFERENCES enrolment (id) ON DELETE CASCADE,
        organisation_id uuid NOT NULL REFERENCES organisation (id),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        evaluation_id uuid NOT NULL REFERENCES evaluation (id),
        test_item_id uuid NOT NULL REFERENCES test_item (id),
        measurand_id uuid NOT NULL REFERENCES measurand (id),
        score_kind text NOT NULL,
        score double precision NOT NULL,
        signal text NOT NULL CHECK (signal IN ('warning', 'action')),
        state text NOT NULL DEFAULT 'open' CHECK (state IN ('open', 'closed')),
        cause_category text CHECK (cause_category IN ('sample-preparation', 'temperature', 'dispersant', 'dilution', 'instrument', 'data-entry', 'other')),
        root_cause text NOT NULL DEFAULT '',
        corrective_action text NOT NULL DEFAULT '',
        effectiveness_check text NOT NULL DEFAULT '',
        closed_by uuid REFERENCES app_user (id),
        closed_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT investigation_unique UNIQUE (evaluation_id, enrolment_id, test_item_id, measurand_id)
      );
      CREATE INDEX investigation_org_idx ON investigation (organisation_id, created_at DESC);

      CREATE TABLE assessor_grant (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organisation_id uuid NOT NULL REFERENCES organisation (id) ON DELETE CASCADE,
        assessor_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        granted_by uuid REFERENCES app_user (id),
        starts_on date NOT NULL DEFAULT CURRENT_DATE,
        ends_on date,
        revoked_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        CHECK (ends_on IS NULL OR ends_on >= starts_on)
      );
      CREATE INDEX assessor_grant_assessor_idx ON assessor_grant (assessor_id);
      CREATE INDEX assessor_grant_org_idx ON assessor_grant (organisation_id);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE assessor_grant;
      DROP TABLE investigation;
      DROP TRIGGER evaluation_result_immutable ON evaluation_result;
      DROP FUNCTION evaluation_result_refuse_published_change();
      DROP TABLE evaluation_result;
      DROP TRIGGER evaluation_published_immutable ON evaluation;
      DROP FUNCTION evaluation_refuse_published_change();
      DROP TABLE evaluation;
    `);
  }
}
