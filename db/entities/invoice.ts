import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

export interface BillTo {
  billingName: string;
  address: string;
  taxId: string;
  poNumber: string;
}

/** The participation-fee invoice of one enrolment. Amounts in integer minor units. */
@Entity({ name: 'invoice' })
export class Invoice {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'integer', name: 'provider_id', default: 1 }) providerId!: number;
  @Column({ type: 'integer' }) year!: number;
  @Column({ type: 'integer' }) seq!: number;
  @Column({ type: 'text', unique: true }) number!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('enrolment_id', { unique: true }) enrolmentId!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @Column({ type: 'jsonb', name: 'bill_to' }) billTo!: BillTo;
  @Column({ type: 'integer', name: 'net_minor' }) netMinor!: number;
  @Column({ type: 'integer', name: 'tax_rate_bp' }) taxRateBp!: number;
  @Column({ type: 'integer', name: 'tax_minor' }) taxMinor!: number;
  @Column({ type: 'integer', name: 'total_minor' }) totalMinor!: number;
  @Column({ type: 'text' }) currency!: string;
  @Column({ type: 'text', default: 'issued' }) status!: 'issued' | 'paid' | 'credited';
  @Column({ type: 'timestamptz', name: 'issued_at', default: () => 'now()' }) issuedAt!: Date;
  @Column({ type: 'date', name: 'due_on' }) dueOn!: string;
  @Column({ type: 'timestamptz', name: 'paid_at', nullable: true }) paidAt!: Date | null;
  @Column({ type: 'date', name: 'paid_on', nullable: true }) paidOn!: string | null;
  @Column({ type: 'text', name: 'paid_method', nullable: true }) paidMethod!:
    'card' | 'bank-transfer' | null;
  @Column({ type: 'text', name: 'paid_reference', nullable: true }) paidReference!: string | null;
  @Column({ type: 'text', name: 'checkout_session_id', nullable: true }) checkoutSessionId!:
    string | null;
  @Column({ type: 'integer', name: 'reminders_sent', default: 0 }) remindersSent!: number;
  @Column({ type: 'timestamptz', name: 'last_reminded_at', nullable: true })
  lastRemindedAt!: Date | null;
}
