import { Column, Entity, PrimaryColumn } from 'typeorm';

/** The last number taken in a gapless series (invoices, credit notes) of a provider and year. */
@Entity({ name: 'billing_counter' })
export class BillingCounter {
  @PrimaryColumn({ type: 'integer', name: 'provider_id', default: 1 }) providerId!: number;
  @PrimaryColumn({ type: 'text' }) series!: 'invoice' | 'credit-note';
  @PrimaryColumn({ type: 'integer' }) year!: number;
  @Column({ type: 'integer', name: 'last_number' }) lastNumber!: number;
}
