import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';
import type { RoundState } from '../../shared/contracts/round-states';

/** A PT scheme (e.g. nanoparticle sizing by DLS): the frame that rounds repeat. */
@Entity({ name: 'scheme' })
export class Scheme {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text', unique: true }) code!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text', default: '' }) description!: string;
  /** Measurand templates new rounds start from (shared/contracts MeasurandInput[]). */
  @Column({ type: 'jsonb', name: 'default_measurands', default: () => "'[]'" })
  defaultMeasurands!: unknown[];
  /** Free-form scheme rules shown to labs (participation, confidentiality, scoring). */
  @Column({ type: 'text', default: '' }) rules!: string;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}

/** One round of a scheme. Its state changes only through the round lifecycle service. */
@Entity({ name: 'round' })
export class Round {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'scheme_id' }) schemeId!: string;
  @Column({ type: 'text', unique: true }) code!: string;
  @Column({ type: 'text' }) title!: string;
  @Column({ type: 'text', default: 'pt' }) kind!: 'pt' | 'precision';
  @Column({ type: 'text', default: 'draft' }) state!: RoundState;
  @Column({ type: 'date', name: 'enrolment_closes_on', nullable: true }) enrolmentClosesOn!:
    string | null;
  @Column({ type: 'date', name: 'dispatch_on', nullable: true }) dispatchOn!: string | null;
  @Column({ type: 'timestamptz', name: 'results_due_at', nullable: true })
  resultsDueAt!: Date | null;
  /** Instructions for labs (Markdown-like plain text), safety cautions included by default. */
  @Column({ type: 'text', default: '' }) instructions!: string;
  /** The measuring temperature the protocol asks for, °C. */
  @Column({ type: 'double precision', name: 'protocol_temperature_c', default: 25 })
  protocolTemperatureC!: number;
  /** Participation fee in minor units (cents). */
  @Column({ type: 'integer', name: 'fee_minor', default: 0 }) feeMinor!: number;
  @Column({ type: 'text', default: 'EUR' }) currency!: string;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' }) updatedAt!: Date;
}

/** A recorded state change of a round (also in the audit trail). */
@Entity({ name: 'round_transition' })
export class RoundTransition {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'text', name: 'from_state' }) fromState!: RoundState;
  @Column({ type: 'text', name: 'to_state' }) toState!: RoundState;
  @Column({ type: 'uuid', name: 'actor_id', nullable: true }) actorId!: string | null;
  @Column({ type: 'text', nullable: true }) reason!: string | null;
  @Column({ type: 'boolean', default: false }) forced!: boolean;
  @CreateDateColumn({ type: 'timestamptz', name: 'at' }) at!: Date;
}

/** A test item shipped to every participant of a round. */
@Entity({ name: 'test_item' })
export class TestItem {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'text' }) code!: string;
  @Column({ type: 'text' }) material!: string;
  @Column({ type: 'double precision', name: 'nominal_size_nm', nullable: true }) nominalSizeNm!:
    number | null;
  @Column({ type: 'text', name: 'storage_notes', default: '' }) storageNotes!: string;
  @Column({ type: 'text', name: 'handling_notes', default: '' }) handlingNotes!: string;
  @Column({ type: 'integer', default: 0 }) position!: number;
}

/** What is measured on each item of a round, with its scoring rules. */
@Entity({ name: 'measurand' })
export class Measurand {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  /** Stable key used in files and APIs: 'z_average', 'pdi', or a coordinator's own. */
  @Column({ type: 'text' }) key!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text' }) unit!: string;
  @Column({ type: 'integer' }) decimals!: number;
  @Column({ type: 'integer', name: 'replicates_required' }) replicatesRequired!: number;
  /** shared/stats SigmaPtRule as JSON. */
  @Column({ type: 'jsonb', name: 'sigma_pt_rule' }) sigmaPtRule!: Record<string, unknown>;
  /** Assigned-value rule as JSON: consensus (Algorithm A), reference value, or median. */
  @Column({ type: 'jsonb', name: 'assigned_value_rule' }) assignedValueRule!: Record<
    string,
    unknown
  >;
  @Column({ type: 'integer', name: 'min_participants', default: 12 }) minParticipants!: number;
  @Column({ type: 'integer', default: 0 }) position!: number;
}

/** A lab's participation in a round, known to others only by its participant code. */
@Entity({ name: 'enrolment' })
export class Enrolment {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'uuid', name: 'organisation_id' }) organisationId!: string;
  @Column({ type: 'text', name: 'participant_code' }) participantCode!: string;
  @Column({ type: 'text', default: 'enrolled' }) state!: 'enrolled' | 'withdrawn';
  @Column({ type: 'text', name: 'withdrawn_reason', nullable: true }) withdrawnReason!:
    string | null;
  /** A deadline extension the coordinator granted (audited). */
  @Column({ type: 'timestamptz', name: 'extension_until', nullable: true })
  extensionUntil!: Date | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'enrolled_at' }) enrolledAt!: Date;
}

/** An e-mailed invitation to enrol in a round (single-use, hashed, expiring token). */
@Entity({ name: 'invitation' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'uuid', name: 'organisation_id', nullable: true }) organisationId!: string | null;
  @Column({ type: 'text' }) email!: string;
  /** For a lab not yet known: the name given by the coordinator. */
  @Column({ type: 'text', name: 'lab_name', nullable: true }) labName!: string | null;
  @Column({ type: 'text', name: 'token_hash', unique: true }) tokenHash!: string;
  @Column({ type: 'timestamptz', name: 'expires_at' }) expiresAt!: Date;
  @Column({ type: 'timestamptz', name: 'accepted_at', nullable: true }) acceptedAt!: Date | null;
  @Column({ type: 'uuid', name: 'enrolment_id', nullable: true }) enrolmentId!: string | null;
  @Column({ type: 'uuid', name: 'created_by', nullable: true }) createdBy!: string | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}

/** Dispatch of the test items to one enrolment, and the lab's receipt. */
@Entity({ name: 'shipment' })
export class Shipment {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'enrolment_id', unique: true }) enrolmentId!: string;
  @Column({ type: 'text', nullable: true }) courier!: string | null;
  @Column({ type: 'text', name: 'tracking_number', nullable: true }) trackingNumber!: string | null;
  @Column({ type: 'date', name: 'dispatched_on', nullable: true }) dispatchedOn!: string | null;
  @Column({ type: 'date', name: 'received_on', nullable: true }) receivedOn!: string | null;
  @Column({ type: 'text', nullable: true }) condition!:
    'intact' | 'damaged' | 'leaked' | 'arrived-warm' | null;
  @Column({ type: 'text', name: 'receipt_notes', nullable: true }) receiptNotes!: string | null;
  @Column({ type: 'bytea', name: 'receipt_photo', nullable: true, select: false })
  receiptPhoto!: Buffer | null;
  @Column({ type: 'text', name: 'receipt_photo_type', nullable: true }) receiptPhotoType!:
    string | null;
  @Column({ type: 'uuid', name: 'received_by', nullable: true }) receivedBy!: string | null;
}

/** A lab's results for a round: a draft saved as it types, then submitted and amended in versions. */
@Entity({ name: 'submission' })
export class Submission {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'enrolment_id', unique: true }) enrolmentId!: string;
  @Column({ type: 'text', default: 'draft' }) state!: 'draft' | 'submitted';
  /** The working copy (shared/contracts/submission SubmissionData). */
  @Column({ type: 'jsonb', default: () => "'{}'" }) draft!: Record<string, unknown>;
  /** Increments on every draft save; the client sends it back to detect lost updates. */
  @Column({ type: 'integer', name: 'draft_revision', default: 0 }) draftRevision!: number;
  /** Latest submitted version number (0 before the first submit). */
  @Column({ type: 'integer', name: 'current_version', default: 0 }) currentVersion!: number;
  @Column({ type: 'timestamptz', name: 'submitted_at', nullable: true }) submittedAt!: Date | null;
  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' }) updatedAt!: Date;
}

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
