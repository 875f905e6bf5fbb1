import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** Accepted reference value of a precision-study level (test item × measurand), for the bias. */
@Entity({ name: 'precision_reference' })
export class PrecisionReference {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'uuid', name: 'test_item_id' }) testItemId!: string;
  @Column({ type: 'uuid', name: 'measurand_id' }) measurandId!: string;
  @Column({ type: 'double precision' }) value!: number;
  @Column({ type: 'double precision', nullable: true }) u!: number | null;
  @Column({ type: 'text' }) source!: string;
  @Column({ type: 'uuid', name: 'updated_by', nullable: true }) updatedBy!: string | null;
  @Column({ type: 'timestamptz', name: 'updated_at', default: () => 'now()' }) updatedAt!: Date;
}
