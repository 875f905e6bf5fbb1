import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Schemes, rounds and their lifecycle, test items, measurands, enrolment, shipments, submissions. */
export class Rounds1764637200000 implements MigrationInterface {
  name = 'Rounds1764637200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE scheme (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        code text NOT NULL UNIQUE,
        name text NOT NULL,
        description text NOT NULL DEFAULT '',
        default_measurands jsonb NOT NULL DEFAULT '[]',
        rules text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now()
      );

      CREATE TABLE round (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        scheme_id uuid NOT NULL REFERENCES scheme (id),
        code text NOT NULL UNIQUE,
        title text NOT NULL,
        kind text NOT NULL DEFAULT 'pt' CHECK (kind IN ('pt', 'precision')),
        state text NOT NULL DEFAULT 'draft'
          CHECK (state IN ('draft', 'enrolling', 'in-transit', 'collecting', 'closed', 'evaluated', 'published', 'reissued')),
        enrolment_closes_on date,
        dispatch_on date,
        results_due_at timestamptz,
        instructions text NOT NULL DEFAULT '',
        protocol_temperature_c double precision NOT NULL DEFAULT 25,
        fee_minor integer NOT NULL DEFAULT 0 CHECK (fee_minor >= 0),
        currency text NOT NULL DEFAULT 'EUR',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX round_scheme_idx ON round (scheme_id);

      CREATE TABLE round_transition (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        from_state text NOT NULL,
        to_state text NOT NULL,
        actor_id uuid REFERENCES app_user (id),
        reason text,
        forced boolean NOT NULL DEFAULT false,
        at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX round_transition_round_idx ON round_transition (round_id, at);

      CREATE TABLE test_item (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        code text NOT NULL,
        material text NOT NULL,
        nominal_size_nm double precision CHECK (nominal_size_nm > 0),
        storage_notes text NOT NULL DEFAULT '',
        handling_notes text NOT NULL DEFAULT '',
        position integer NOT NULL DEFAULT 0,
        CONSTRAINT test_item_round_code UNIQUE (round_id, code)
      );

      CREATE TABLE measurand (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        key text NOT NULL,
        name text NOT NULL,
        unit text NOT NULL,
        decimals integer NOT NULL CHECK (decimals BETWEEN 0 AND 6),
        replicates_required integer NOT NULL CHECK (replicates_required BETWEEN 1 AND 20),
        sigma_pt_rule jsonb NOT NULL,
        assigned_value_rule jsonb NOT NULL,
        min_participants integer NOT NULL DEFAULT 12 CHECK (min_participants >= 1),
        position integer NOT NULL DEFAULT 0,
        CONSTRAINT measurand_round_key UNIQUE (round_id, key)
      );

      CREATE TABLE enrolment (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        organisation_id uuid NOT NULL REFERENCES organisation (id),
        participant_code text NOT NULL,
        state text NOT NULL DEFAULT 'enrolled' CHECK (state IN ('enrolled', 'withdrawn')),
        withdrawn_reason text,
        extension_until timestamptz,
        enrolled_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT enrolment_round_org UNIQUE (round_id, organisation_id),
        CONSTRAINT enrolment_round_code UNIQUE (round_id, participant_code)
      );
      CREATE INDEX enrolment_organisation_idx ON enrolment (organisation_id);

      CREATE TABLE invitation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE CASCADE,
        organisation_id uuid REFERENCES organisation (id),
        email text NOT NULL,
        lab_name text,
        token_hash text NOT NULL UNIQUE,
        expires_at timestamptz NOT NULL,
        accepted_at timestamptz,
        enrolment_id uuid REFERENCES enrolment (id),
        created_by uuid REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX invitation_round_idx ON invitation (round_id);

      CREATE TABLE shipment (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        enrolment_id uuid NOT NULL UNIQUE REFERENCES enrolment (id) ON DELETE CASCADE,
        courier text,
        tracking_number text,
        dispatched_on date,
        received_on date,
        condition text CHECK (condition IN ('intact', 'damaged', 'leaked', 'arrived-warm')),
        receipt_notes text,
        receipt_photo bytea,
        receipt_photo_type text,
        received_by uuid REFERENCES app_user (id)
      );

      CREATE TABLE submission (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        enrolment_id uuid NOT NULL UNIQUE REFERENCES enrolment (id) ON DELETE CASCADE,
        state text NOT NULL DEFAULT 'draft' CHECK (state IN ('draft', 'submitted')),
        draft jsonb NOT NULL DEFAULT '{}',
        draft_revision integer NOT NULL DEFAULT 0,
        current_version integer NOT NULL DEFAULT 0,
        submitted_at timestamptz,
        updated_at timestamptz NOT NULL DEFAULT now()
      );

      CREATE TABLE submission_version (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        submission_id uuid NOT NULL REFERENCES submission (id) ON DELETE CASCADE,
        version integer NOT NULL,
        data jsonb NOT NULL,
        submitted_by uuid REFERENCES app_user (id),
        note text,
        submitted_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT submission_version_unique UNIQUE (submission_id, version)
      );
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE submission_version;
      DROP TABLE submission;
      DROP TABLE shipment;
      DROP TABLE invitation;
      DROP TABLE enrolment;
      DROP TABLE measurand;
      DROP TABLE test_item;
      DROP TABLE round_transition;
      DROP TABLE round;
      DROP TABLE scheme;
    `);
  }
}
