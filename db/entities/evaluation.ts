import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** One version of a round's evaluation: draft → committed → published (then immutable). */
@Entity({ name: 'evaluation' })
export class Evaluation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'text', default: 'draft' }) state!: 'draft' | 'committed' | 'published';
  /** shared/contracts/evaluation EvaluationSettings: σ_pt overrides and exclusions. */
  @Column({ type: 'jsonb', default: () => "'{}'" }) settings!: Record<string, unknown>;
  @Column({ type: 'text', name: 'software_version' }) softwareVersion!: string;
  @Column({ type: 'text', name: 'reissue_reason', nullable: true }) reissueReason!: string | null;
  /** The codes-only board (shared/contracts/evaluation BoardData), precomputed for fast reads. */
  @Column({ type: 'jsonb', default: () => "'{}'", select: false }) board!: Record<string, unknown>;
  @Column({ type: 'timestamptz', name: 'computed_at', default: () => 'now()' }) computedAt!: Date;
  @UuidColumn('created_by', { nullable: true }) createdBy!: string | null;
  @CreatedAtColumn() createdAt!: Date;
  @Column({ type: 'timestamptz', name: 'committed_at', nullable: true }) committedAt!: Date | null;
  @Column({ type: 'timestamptz', name: 'published_at', nullable: true }) publishedAt!: Date | null;
  /** The coordinator's comments printed in the round report (editable until published). */
  @Column({ type: 'text', name: 'coordinator_comments', default: '' }) coordinatorComments!: string;
}
