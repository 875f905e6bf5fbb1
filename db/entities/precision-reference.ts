import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** Accepted reference value of a precision-study level (test item × measurand), for the bias. */
@Entity({ name: 'precision_reference' })
export class PrecisionReference {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('test_item_id') testItemId!: string;
  @UuidColumn('measurand_id') measurandId!: string;
  @Column({ type: 'double precision' }) value!: number;
  @Column({ type: 'double precision', nullable: true }) u!: number | null;
  @Column({ type: 'text' }) source!: string;
  @UuidColumn('updated_by', { nullable: true }) updatedBy!: string | null;
  @Column({ type: 'timestamptz', name: 'updated_at', default: () => 'now()' }) updatedAt!: Date;
}
