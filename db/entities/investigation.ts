import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn, UuidColumn } from './columns';

/** A lab's investigation of a warning or action signal (ISO/IEC 17025 corrective action). */
@Entity({ name: 'investigation' })
export class Investigation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('enrolment_id') enrolmentId!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('evaluation_id') evaluationId!: string;
  @UuidColumn('test_item_id') testItemId!: string;
  @UuidColumn('measurand_id') measurandId!: string;
  @Column({ type: 'text', name: 'score_kind' }) scoreKind!: string;
  @Column({ type: 'double precision' }) score!: number;
  @Column({ type: 'text' }) signal!: 'warning' | 'action';
  @Column({ type: 'text', default: 'open' }) state!: 'open' | 'closed';
  @Column({ type: 'text', name: 'cause_category', nullable: true }) causeCategory!: string | null;
  @Column({ type: 'text', name: 'root_cause', default: '' }) rootCause!: string;
  @Column({ type: 'text', name: 'corrective_action', default: '' }) correctiveAction!: string;
  @Column({ type: 'text', name: 'effectiveness_check', default: '' }) effectivenessCheck!: string;
  @UuidColumn('closed_by', { nullable: true }) closedBy!: string | null;
  @Column({ type: 'timestamptz', name: 'closed_at', nullable: true }) closedAt!: Date | null;
  @CreatedAtColumn() createdAt!: Date;
  @UpdatedAtColumn() updatedAt!: Date;
}
