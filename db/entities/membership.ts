import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm';
import { UuidColumn } from './columns';
import type { Organisation } from './organisation';
import type { User } from './user';

/** A user's membership of a lab; `isManager` lets them manage the lab's own users. */
@Entity({ name: 'membership' })
@Unique('membership_user_org', ['userId', 'organisationId'])
export class Membership {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('user_id') userId!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @Column({ type: 'boolean', name: 'is_manager', default: false }) isManager!: boolean;
  @ManyToOne('User', (u: User) => u.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user?: User;
  @ManyToOne('Organisation', (o: Organisation) => o.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Organisation;
}
