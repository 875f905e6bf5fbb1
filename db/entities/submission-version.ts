import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
} from 'typeorm';
import type { User } from './user';

/** An immutable submitted version of a lab's results (every amendment adds one). */
@Entity({ name: 'submission_version' })
export class SubmissionVersion {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'submission_id' }) submissionId!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'jsonb' }) data!: Record<string, unknown>;
  @Column({ type: 'uuid', name: 'submitted_by', nullable: true }) submittedBy!: string | null;
  @Column({ type: 'text', nullable: true }) note!: string | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'submitted_at' }) submittedAt!: Date;
  /** The client's key for one submit: a retry with the same key returns this version. */
  @Column({ type: 'text', name: 'idempotency_key', nullable: true }) idempotencyKey!: string | null;
  @Column({ type: 'boolean', name: 'is_late', default: false }) isLate!: boolean;
  /** The lab's instrument check the submit was made under, if any. */
  @Column({ type: 'uuid', name: 'instrument_check_id', nullable: true }) instrumentCheckId!:
    string | null;
  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'submitted_by' })
  submitter?: User | null;
}
