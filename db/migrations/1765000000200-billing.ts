import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Participation fees: the provider's tax rate, a lab's billing details, gapless document
 * counters (one row per provider, series and year, locked by the transaction that takes a
 * number), invoices (one per enrolment; integer minor units), credit notes, the payment
 * provider's events (unique event id: a replay changes nothing) and a round's billing setting.
 */
export class Billing1765000000200 implements MigrationInterface {
  name = 'Billing1765000000200';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE provider_profile
        ADD COLUMN tax_rate_bp integer NOT NULL DEFAULT 0 CHECK (tax_rate_bp BETWEEN 0 AND 10000);

      CREATE TABLE billing_details (
        organisation_id uuid PRIMARY KEY REFERENCES organisation (id) ON DELETE CASCADE,
        billing_name text NOT NULL,
        address text NOT NULL DEFAULT '',
        tax_id text NOT NULL DEFAULT '',
        po_number text NOT NULL DEFAULT '',
        updated_at timestamptz NOT NULL DEFAULT now(),
        updated_by uuid REFERENCES app_user (id) ON DELETE SET NULL
      );

      CREATE TABLE billing_counter (
        provider_id integer NOT NULL DEFAULT 1,
        series text NOT NULL CHECK (series IN ('invoice', 'credit-note')),
        year integer NOT NULL CHECK (year BETWEEN 2000 AND 2100),
        last_number integer NOT NULL CHECK (last_number > 0),
        PRIMARY KEY (provider_id, series, year)
      );

      CREATE TABLE invoice (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        provider_id integer NOT NULL DEFAULT 1,
        year integer NOT NULL,
        seq integer NOT NULL CHECK (seq > 0),
        number text NOT NULL UNIQUE,
        round_id uuid NOT NULL REFERENCES round (id) ON DELETE RESTRICT,
        enrolment_id uuid NOT NULL UNIQUE REFERENCES enrolment (id) ON DELETE RESTRICT,
        organisation_id uuid NOT NULL REFERENCES organisation (id) ON DELETE RESTRICT,
        bill_to jsonb NOT NULL,
        net_minor integer NOT NULL CHECK (net_minor >= 0),
        tax_rate_bp integer NOT NULL CHECK (tax_rate_bp BETWEEN 0 AND 10000),
        tax_minor integer NOT NULL CHECK (tax_minor >= 0),
        total_minor integer NOT NULL CHECK (total_minor = net_minor + tax_minor),
        currency text NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
        status text NOT NULL DEFAULT 'issued' CHECK (status IN ('issued', 'paid', 'credited')),
        issued_at timestamptz NOT NULL DEFAULT now(),
        due_on date NOT NULL,
        paid_at timestamptz,
        paid_on date,
        paid_method text CHECK (paid_method IN ('card', 'bank-transfer')),
        paid_reference text,
        checkout_session_id text,
        reminders_sent integer NOT NULL DEFAULT 0,
        last_reminded_at timestamptz,
        UNIQUE (provider_id, year, seq),
        CHECK ((paid_at IS NULL) = (paid_method IS NULL))
      );
      CREATE INDEX invoice_round ON invoice (round_id);
      CREATE INDEX invoice_organisation ON invoice (organisation_id);

      CREATE TABLE credit_note (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        provider_id integer NOT NULL DEFAULT 1,
        year integer NOT NULL,
        seq integer NOT NULL CHECK (seq > 0),
        number text NOT NULL UNIQUE,
        invoice_id uuid NOT NULL UNIQUE REFERENCES invoice (id) ON DELETE RESTRICT,
        net_minor integer NOT NULL CHECK (net_minor >= 0),
        tax_minor integer NOT NULL CHECK (tax_minor >= 0),
        total_minor integer NOT NULL CHECK (total_minor = net_minor + tax_minor),
        currency text NOT NULL,
        reason text NOT NULL,
        issued_at timestamptz NOT NULL DEFAULT now(),
        issued_by uuid REFERENCES app_user (id) ON DELETE SET NULL,
        UNIQUE (provider_id, year, seq)
      );

      CREATE TABLE payment_event (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        provider_event_id text NOT NULL UNIQUE,
        type text NOT NULL,
        invoice_id uuid REFERENCES invoice (id) ON DELETE SET NULL,
        outcome text NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now()
      );

      CREATE TABLE round_billing (
        round_id uuid PRIMARY KEY REFERENCES round (id) ON DELETE CASCADE,
        ship_unpaid boolean NOT NULL DEFAULT true
      );
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE round_billing;
      DROP TABLE payment_event;
      DROP TABLE credit_note;
      DROP TABLE invoice;
      DROP TABLE billing_counter;
      DROP TABLE billing_details;
      ALTER TABLE provider_profile DROP COLUMN tax_rate_bp;
    `);
  }
}
