import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** Cancels an invoice in full (own gapless series, e.g. CN-2026-0001). */
@Entity({ name: 'credit_note' })
export class CreditNote {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'integer', name: 'provider_id', default: 1 }) providerId!: number;
  @Column({ type: 'integer' }) year!: number;
  @Column({ type: 'integer' }) seq!: number;
  @Column({ type: 'text', unique: true }) number!: string;
  @UuidColumn('invoice_id', { unique: true }) invoiceId!: string;
  @Column({ type: 'integer', name: 'net_minor' }) netMinor!: number;
  @Column({ type: 'integer', name: 'tax_minor' }) taxMinor!: number;
  @Column({ type: 'integer', name: 'total_minor' }) totalMinor!: number;
  @Column({ type: 'text' }) currency!: string;
  @Column({ type: 'text' }) reason!: string;
  @Column({ type: 'timestamptz', name: 'issued_at', default: () => 'now()' }) issuedAt!: Date;
  @UuidColumn('issued_by', { nullable: true }) issuedBy!: string | null;
}
