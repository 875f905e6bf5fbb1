import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';

/** A lab's investigation of a warning or action signal (ISO/IEC 17025 corrective action). */
@Entity({ name: 'investigation' })
export class Investigation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'enrolment_id' }) enrolmentId!: string;
  @Column({ type: 'uuid', name: 'organisation_id' }) organisationId!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'uuid', name: 'evaluation_id' }) evaluationId!: string;
  @Column({ type: 'uuid', name: 'test_item_id' }) testItemId!: string;
  @Column({ type: 'uuid', name: 'measurand_id' }) measurandId!: string;
  @Column({ type: 'text', name: 'score_kind' }) scoreKind!: string;
  @Column({ type: 'double precision' }) score!: number;
  @Column({ type: 'text' }) signal!: 'warning' | 'action';
  @Column({ type: 'text', default: 'open' }) state!: 'open' | 'closed';
  @Column({ type: 'text', name: 'cause_category', nullable: true }) causeCategory!: string | null;
  @Column({ type: 'text', name: 'root_cause', default: '' }) rootCause!: string;
  @Column({ type: 'text', name: 'corrective_action', default: '' }) correctiveAction!: string;
  @Column({ type: 'text', name: 'effectiveness_check', default: '' }) effectivenessCheck!: string;
  @Column({ type: 'uuid', name: 'closed_by', nullable: true }) closedBy!: string | null;
  @Column({ type: 'timestamptz', name: 'closed_at', nullable: true }) closedAt!: Date | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' }) updatedAt!: Date;
}
