import { Column, Entity, PrimaryColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** What a lab's invoices are addressed to (entered by the lab; the lab's name by default). */
@Entity({ name: 'billing_details' })
export class BillingDetails {
  @PrimaryColumn({ type: 'uuid', name: 'organisation_id' }) organisationId!: string;
  @Column({ type: 'text', name: 'billing_name' }) billingName!: string;
  @Column({ type: 'text', default: '' }) address!: string;
  @Column({ type: 'text', name: 'tax_id', default: '' }) taxId!: string;
  @Column({ type: 'text', name: 'po_number', default: '' }) poNumber!: string;
  @Column({ type: 'timestamptz', name: 'updated_at', default: () => 'now()' }) updatedAt!: Date;
  @UuidColumn('updated_by', { nullable: true }) updatedBy!: string | null;
}
