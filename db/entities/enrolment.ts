import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** A lab's participation in a round, known to others only by its participant code. */
@Entity({ name: 'enrolment' })
export class Enrolment {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @Column({ type: 'text', name: 'participant_code' }) participantCode!: string;
  @Column({ type: 'text', default: 'enrolled' }) state!: 'enrolled' | 'withdrawn';
  @Column({ type: 'text', name: 'withdrawn_reason', nullable: true }) withdrawnReason!:
    string | null;
  /** A deadline extension the coordinator granted (audited). */
  @Column({ type: 'timestamptz', name: 'extension_until', nullable: true })
  extensionUntil!: Date | null;
  @CreatedAtColumn('enrolled_at') enrolledAt!: Date;
}
