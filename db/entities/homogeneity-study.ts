import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** A homogeneity or stability study of one test item × measurand (ISO 13528 Annex B), with its result. */
@Entity({ name: 'homogeneity_study' })
export class HomogeneityStudy {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('test_item_id') testItemId!: string;
  @UuidColumn('measurand_id') measurandId!: string;
  @Column({ type: 'text' }) kind!: 'homogeneity' | 'stability';
  /** σ_pt the check used, unit of the measurand. */
  @Column({ type: 'double precision', name: 'sigma_pt' }) sigmaPt!: number;
  /** The measurements as entered (shared/contracts/rounds HomogeneityData / StabilityData). */
  @Column({ type: 'jsonb' }) data!: Record<string, unknown>;
  /** The computed check (shared/stats HomogeneityResult / StabilityResult). */
  @Column({ type: 'jsonb' }) result!: Record<string, unknown>;
  @Column({ type: 'boolean' }) passes!: boolean;
  @Column({ type: 'text', nullable: true }) decision!:
    'accept' | 'widen-sigma-pt' | 'exclude-item' | null;
  @Column({ type: 'text', name: 'decision_reason', nullable: true }) decisionReason!: string | null;
  @UuidColumn('decided_by', { nullable: true }) decidedBy!: string | null;
  @Column({ type: 'timestamptz', name: 'decided_at', nullable: true }) decidedAt!: Date | null;
  @UuidColumn('created_by', { nullable: true }) createdBy!: string | null;
  @CreatedAtColumn() createdAt!: Date;
}
