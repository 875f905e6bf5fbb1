import { Column, Entity, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';
import type { GlobalRole } from '../../shared/contracts/auth';
import type { Membership } from './membership';

@Entity({ name: 'app_user' })
export class User {
  @PrimaryGeneratedColumn('uuid') id!: string;
  /** Stored lower-case; unique. */
  @Column({ type: 'text', unique: true }) email!: string;
  @Column({ type: 'text' }) name!: string;
  /** bcrypt hash; null until the user sets a first password. */
  @Column({ type: 'text', name: 'password_hash', nullable: true }) passwordHash!: string | null;
  @Column({ type: 'text', array: true, default: () => "'{}'" }) roles!: GlobalRole[];
  @Column({ type: 'boolean', name: 'is_active', default: true }) isActive!: boolean;
  @Column({ type: 'boolean', name: 'is_demo', default: false }) isDemo!: boolean;
  @Column({ type: 'timestamptz', name: 'last_sign_in_at', nullable: true })
  lastSignInAt!: Date | null;
  @CreatedAtColumn() createdAt!: Date;
  @OneToMany('Membership', (m: Membership) => m.user) memberships?: Membership[];
}
