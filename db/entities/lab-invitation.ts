import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';
import type { Organisation } from './organisation';
import type { User } from './user';

/** How a lab invitation was answered; null while it is open. */
export type LabInvitationAnswer = 'accepted' | 'declined' | 'withdrawn';

/**
 * A lab manager's invitation of an existing account to join the lab: no membership until the
 * person accepts; one open invitation per lab and person (`lab_invitation_open`).
 */
@Entity({ name: 'lab_invitation' })
export class LabInvitation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @UuidColumn('user_id') userId!: string;
  @Column({ type: 'boolean', name: 'is_manager', default: false }) isManager!: boolean;
  @UuidColumn('invited_by', { nullable: true }) invitedBy!: string | null;
  @CreatedAtColumn() createdAt!: Date;
  @Column({ type: 'timestamptz', name: 'expires_at' }) expiresAt!: Date;
  @Column({ type: 'timestamptz', name: 'answered_at', nullable: true }) answeredAt!: Date | null;
  @Column({ type: 'text', nullable: true }) answer!: LabInvitationAnswer | null;
  @ManyToOne('Organisation', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Organisation;
  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user?: User;
  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'invited_by' })
  inviter?: User | null;
}
