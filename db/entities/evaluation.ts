import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';

/** One version of a round's evaluation: draft → committed → published (then immutable). */
@Entity({ name: 'evaluation' })
export class Evaluation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'text', default: 'draft' }) state!: 'draft' | 'committed' | 'published';
  /** shared/contracts/evaluation EvaluationSettings: σ_pt overrides and exclusions. */
  @Column({ type: 'jsonb', default: () => "'{}'" }) settings!: Record<string, unknown>;
  @Column({ type: 'text', name: 'software_version' }) softwareVersion!: string;
  @Column({ type: 'text', name: 'reissue_reason', nullable: true }) reissueReason!: string | null;
  /** The codes-only board (shared/contracts/evaluation BoardData), precomputed for fast reads. */
  @Column({ type: 'jsonb', default: () => "'{}'", select: false }) board!: Record<string, unknown>;
  @Column({ type: 'timestamptz', name: 'computed_at', default: () => 'now()' }) computedAt!: Date;
  @Column({ type: 'uuid', name: 'created_by', nullable: true }) createdBy!: string | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
  @Column({ type: 'timestamptz', name: 'committed_at', nullable: true }) committedAt!: Date | null;
  @Column({ type: 'timestamptz', name: 'published_at', nullable: true }) publishedAt!: Date | null;
}

/** The stored record of one item × measurand of an evaluation, with everything to reproduce it. */
@Entity({ name: 'evaluation_result' })
export class EvaluationResult {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'evaluation_id' }) evaluationId!: string;
  @Column({ type: 'uuid', name: 'test_item_id' }) testItemId!: string;
  @Column({ type: 'uuid', name: 'measurand_id' }) measurandId!: string;
  @Column({ type: 'text', name: 'item_code' }) itemCode!: string;
  @Column({ type: 'text', name: 'measurand_key' }) measurandKey!: string;
  @Column({ type: 'integer' }) n!: number;
  @Column({ type: 'double precision', name: 'assigned_value', nullable: true }) assignedValue!:
    number | null;
  @Column({ type: 'double precision', name: 'u_assigned', nullable: true }) uAssigned!:
    number | null;
  @Column({ type: 'double precision', name: 'sigma_pt', nullable: true }) sigmaPt!: number | null;
  @Column({ type: 'text' }) method!: string;
  @Column({ type: 'jsonb', default: () => "'{}'" }) constants!: Record<string, unknown>;
  @Column({ type: 'integer', default: 0 }) iterations!: number;
  @Column({ type: 'jsonb', default: () => "'[]'" }) warnings!: string[];
  /** Replicates used: [{ code, values, uncertainty }]. */
  @Column({ type: 'jsonb', default: () => "'[]'" }) inputs!: unknown[];
  /** Per participant: result, replicate SD, scores, signal, hints (shared ParticipantScore). */
  @Column({ type: 'jsonb', default: () => "'[]'" }) participants!: unknown[];
}

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

/** A lab's permission for an assessor to read its results, investigations and evidence. */
@Entity({ name: 'assessor_grant' })
export class AssessorGrant {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'organisation_id' }) organisationId!: string;
  @Column({ type: 'uuid', name: 'assessor_id' }) assessorId!: string;
  @Column({ type: 'uuid', name: 'granted_by', nullable: true }) grantedBy!: string | null;
  @Column({ type: 'date', name: 'starts_on' }) startsOn!: string;
  @Column({ type: 'date', name: 'ends_on', nullable: true }) endsOn!: string | null;
  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true }) revokedAt!: Date | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}
