import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** A single-use, expiring link for a first password or a reset. Only the SHA-256 hash is stored. */
@Entity({ name: 'password_token' })
export class PasswordToken {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('user_id') userId!: string;
  @Column({ type: 'text', name: 'token_hash', unique: true }) tokenHash!: string;
  @Column({ type: 'text' }) purpose!: 'first-password' | 'reset';
  @Column({ type: 'timestamptz', name: 'expires_at' }) expiresAt!: Date;
  @Column({ type: 'timestamptz', name: 'used_at', nullable: true }) usedAt!: Date | null;
  @CreatedAtColumn() createdAt!: Date;
}
