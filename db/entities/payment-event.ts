import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** An event the payment provider sent to the webhook; its id is unique, so a replay is a no-op. */
@Entity({ name: 'payment_event' })
export class PaymentEvent {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text', name: 'provider_event_id', unique: true }) providerEventId!: string;
  @Column({ type: 'text' }) type!: string;
  @UuidColumn('invoice_id', { nullable: true }) invoiceId!: string | null;
  @Column({ type: 'text' }) outcome!: string;
  @Column({ type: 'timestamptz', name: 'received_at', default: () => 'now()' }) receivedAt!: Date;
}
