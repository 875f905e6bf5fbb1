import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

export type ReportKind =
  'round.xlsx' | 'round.pdf' | 'participant.pdf' | 'certificate.pdf' | 'evidence.zip';

/** A built report file (the cache shared by every server instance) and its build status. */
@Entity({ name: 'report' })
export class Report {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id', { nullable: true }) roundId!: string | null;
  @Column({ type: 'text' }) kind!: ReportKind;
  /** The lab of a lab-specific file (individual report, certificate, evidence pack). */
  @UuidColumn('organisation_id', { nullable: true }) organisationId!: string | null;
  @UuidColumn('evaluation_id', { nullable: true }) evaluationId!: string | null;
  @Column({ type: 'integer', name: 'evaluation_version', nullable: true }) evaluationVersion!:
    number | null;
  @Column({ type: 'text', default: 'queued' }) status!: 'queued' | 'running' | 'done' | 'failed';
  @Column({ type: 'integer', default: 0 }) progress!: number;
  @Column({ type: 'bytea', nullable: true, select: false }) file!: Buffer | null;
  @Column({ type: 'text', nullable: true }) sha256!: string | null;
  @Column({ type: 'integer', name: 'size_bytes', nullable: true }) sizeBytes!: number | null;
  @Column({ type: 'text', nullable: true }) error!: string | null;
  @UuidColumn('requested_by', { nullable: true }) requestedBy!: string | null;
  @CreatedAtColumn() createdAt!: Date;
  @Column({ type: 'timestamptz', name: 'finished_at', nullable: true }) finishedAt!: Date | null;
}
