import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UpdatedAtColumn, UuidColumn } from './columns';

/** A lab's results for a round: a draft saved as it types, then submitted and amended in versions. */
@Entity({ name: 'submission' })
export class Submission {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('enrolment_id', { unique: true }) enrolmentId!: string;
  @Column({ type: 'text', default: 'draft' }) state!: 'draft' | 'submitted';
  /** The working copy (shared/contracts/submission SubmissionData). */
  @Column({ type: 'jsonb', default: () => "'{}'" }) draft!: Record<string, unknown>;
  /** Increments on every draft save; the client sends it back to detect lost updates. */
  @Column({ type: 'integer', name: 'draft_revision', default: 0 }) draftRevision!: number;
  /** Latest submitted version number (0 before the first submit). */
  @Column({ type: 'integer', name: 'current_version', default: 0 }) currentVersion!: number;
  @Column({ type: 'timestamptz', name: 'submitted_at', nullable: true }) submittedAt!: Date | null;
  @UpdatedAtColumn() updatedAt!: Date;
}
