import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** Dispatch of the test items to one enrolment, and the lab's receipt. */
@Entity({ name: 'shipment' })
export class Shipment {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('enrolment_id', { unique: true }) enrolmentId!: string;
  @Column({ type: 'text', nullable: true }) courier!: string | null;
  @Column({ type: 'text', name: 'tracking_number', nullable: true }) trackingNumber!: string | null;
  @Column({ type: 'date', name: 'dispatched_on', nullable: true }) dispatchedOn!: string | null;
  @Column({ type: 'date', name: 'received_on', nullable: true }) receivedOn!: string | null;
  @Column({ type: 'text', nullable: true }) condition!:
    'intact' | 'damaged' | 'leaked' | 'arrived-warm' | null;
  @Column({ type: 'text', name: 'receipt_notes', nullable: true }) receiptNotes!: string | null;
  @Column({ type: 'bytea', name: 'receipt_photo', nullable: true, select: false })
  receiptPhoto!: Buffer | null;
  @Column({ type: 'text', name: 'receipt_photo_type', nullable: true }) receiptPhotoType!:
    string | null;
  @UuidColumn('received_by', { nullable: true }) receivedBy!: string | null;
}
