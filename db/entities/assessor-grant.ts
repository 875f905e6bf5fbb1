import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

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
