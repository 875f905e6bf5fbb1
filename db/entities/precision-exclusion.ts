import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** A coordinator's decision on a flagged cell (replicate null) or one replicate of a precision study. */
@Entity({ name: 'precision_exclusion' })
export class PrecisionExclusion {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('test_item_id') testItemId!: string;
  @UuidColumn('measurand_id') measurandId!: string;
  @UuidColumn('enrolment_id') enrolmentId!: string;
  @Column({ type: 'text', name: 'participant_code' }) participantCode!: string;
  @Column({ type: 'integer', nullable: true }) replicate!: number | null;
  @Column({ type: 'text' }) kind!: 'straggler' | 'outlier' | 'other';
  @Column({ type: 'text' }) decision!: 'confirmed' | 'rejected';
  @Column({ type: 'text' }) reason!: string;
  @UuidColumn('actor_id', { nullable: true }) actorId!: string | null;
  @Column({ type: 'timestamptz', default: () => 'clock_timestamp()' }) at!: Date;
  @Column({ type: 'timestamptz', name: 'withdrawn_at', nullable: true }) withdrawnAt!: Date | null;
  @UuidColumn('withdrawn_by', { nullable: true }) withdrawnBy!: string | null;
  @Column({ type: 'text', name: 'withdrawn_reason', nullable: true }) withdrawnReason!:
    string | null;
}
