import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

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
}
