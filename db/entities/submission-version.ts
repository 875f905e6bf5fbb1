import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';
import type { User } from './user';

/** An immutable submitted version of a lab's results (every amendment adds one). */
@Entity({ name: 'submission_version' })
export class SubmissionVersion {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('submission_id') submissionId!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'jsonb' }) data!: Record<string, unknown>;
  @UuidColumn('submitted_by', { nullable: true }) submittedBy!: string | null;
  @Column({ type: 'text', nullable: true }) note!: string | null;
  @CreatedAtColumn('submitted_at') submittedAt!: Date;
  /** The client's key for one submit: a retry with the same key returns this version. */
  @Column({ type: 'text', name: 'idempotency_key', nullable: true }) idempotencyKey!: string | null;
  @Column({ type: 'boolean', name: 'is_late', default: false }) isLate!: boolean;
  /** The lab's instrument check the submit was made under, if any. */
  @UuidColumn('instrument_check_id', { nullable: true }) instrumentCheckId!: string | null;
  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'submitted_by' })
  submitter?: User | null;
}
