import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** A lab's permission for an assessor to read its results, investigations and evidence. */
@Entity({ name: 'assessor_grant' })
export class AssessorGrant {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @UuidColumn('assessor_id') assessorId!: string;
  @UuidColumn('granted_by', { nullable: true }) grantedBy!: string | null;
  @Column({ type: 'date', name: 'starts_on' }) startsOn!: string;
  @Column({ type: 'date', name: 'ends_on', nullable: true }) endsOn!: string | null;
  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true }) revokedAt!: Date | null;
  @CreatedAtColumn() createdAt!: Date;
}
