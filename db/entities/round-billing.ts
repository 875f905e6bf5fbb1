import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A round's billing setting: whether a lab with an unpaid invoice still gets its test items. */
@Entity({ name: 'round_billing' })
export class RoundBilling {
  @PrimaryColumn({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'boolean', name: 'ship_unpaid', default: true }) shipUnpaid!: boolean;
}
