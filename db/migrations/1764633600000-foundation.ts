import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Users, labs, memberships, password links, sessions, rate limits, audit trail, outbox. */
export class Foundation1764633600000 implements MigrationInterface {
  name = 'Foundation1764633600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE organisation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name text NOT NULL,
        kind text NOT NULL DEFAULT 'lab' CHECK (kind IN ('lab', 'provider')),
        country text,
        contact_email text,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX organisation_name_key ON organisation (lower(name));

      CREATE TABLE app_user (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL UNIQUE CHECK (email = lower(email)),
        name text NOT NULL,
        password_hash text,
        roles text[] NOT NULL DEFAULT '{}',
        is_active boolean NOT NULL DEFAULT true,
        is_demo boolean NOT NULL DEFAULT false,
        last_sign_in_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        CHECK (roles <@ ARRAY['admin', 'coordinator', 'assessor']::text[])
      );

      CREATE TABLE membership (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        organisation_id uuid NOT NULL REFERENCES organisation (id) ON DELETE CASCADE,
        is_manager boolean NOT NULL DEFAULT false,
        CONSTRAINT membership_user_org UNIQUE (user_id, organisation_id)
      );
      CREATE INDEX membership_organisation_idx ON membership (organisation_id);

      CREATE TABLE password_token (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        token_hash text NOT NULL UNIQUE,
        purpose text NOT NULL CHECK (purpose IN ('first-password', 'reset')),
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );

      -- express-session store (connect-pg-simple's table layout)
      CREATE TABLE session (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      );
      CREATE INDEX session_expire_idx ON session (expire);

      -- fixed-window request counters shared by every server instance
      CREATE TABLE rate_limit (
        key text PRIMARY KEY,
        window_start timestamptz NOT NULL,
        hits integer NOT NULL
      );

      CREATE TABLE audit_event (
        id bigserial PRIMARY KEY,
        at timestamptz NOT NULL DEFAULT now(),
        actor_id uuid,
        action text NOT NULL,
        subject_type text NOT NULL,
        subject_id text,
        details jsonb NOT NULL DEFAULT '{}'
      );
      CREATE INDEX audit_event_subject_idx ON audit_event (subject_type, subject_id);
      CREATE FUNCTION audit_event_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'audit_event is append-only';
      END $$;
      CREATE TRIGGER audit_event_no_change BEFORE UPDATE OR DELETE ON audit_event
        FOR EACH ROW EXECUTE FUNCTION audit_event_append_only();
      CREATE TRIGGER audit_event_no_truncate BEFORE TRUNCATE ON audit_event
        FOR EACH STATEMENT EXECUTE FUNCTION audit_event_append_only();

      CREATE TABLE mail_message (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        mail_from text NOT NULL,
        mail_to text[] NOT NULL,
        subject text NOT NULL,
        text text NOT NULL,
        html text,
        received_at timestamptz NOT NULL DEFAULT now()
      );
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE mail_message;
      DROP TABLE audit_event;
      DROP FUNCTION audit_event_append_only();
      DROP TABLE rate_limit;
      DROP TABLE session;
      DROP TABLE password_token;
      DROP TABLE membership;
      DROP TABLE app_user;
      DROP TABLE organisation;
    `);
  }
}
