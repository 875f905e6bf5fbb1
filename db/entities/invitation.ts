import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

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
