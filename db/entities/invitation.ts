import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** An e-mailed invitation to enrol in a round (single-use, hashed, expiring token). */
@Entity({ name: 'invitation' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('organisation_id', { nullable: true }) organisationId!: string | null;
  @Column({ type: 'text' }) email!: string;
  /** For a lab not yet known: the name given by the coordinator. */
  @Column({ type: 'text', name: 'lab_name', nullable: true }) labName!: string | null;
  @Column({ type: 'text', name: 'token_hash', unique: true }) tokenHash!: string;
  @Column({ type: 'timestamptz', name: 'expires_at' }) expiresAt!: Date;
  @Column({ type: 'timestamptz', name: 'accepted_at', nullable: true }) acceptedAt!: Date | null;
  @UuidColumn('enrolment_id', { nullable: true }) enrolmentId!: string | null;
  @UuidColumn('created_by', { nullable: true }) createdBy!: string | null;
  @CreatedAtColumn() createdAt!: Date;
}
