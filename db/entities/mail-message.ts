import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';

/**
 * A message captured by the local SMTP fake (development and demo only), shown on the Outbox page.
 * Kept in PostgreSQL so every server instance sees the same outbox.
 */
@Entity({ name: 'mail_message' })
export class MailMessage {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text', name: 'mail_from' }) from!: string;
  @Column({ type: 'text', array: true, name: 'mail_to' }) to!: string[];
  @Column({ type: 'text' }) subject!: string;
  @Column({ type: 'text' }) text!: string;
  @Column({ type: 'text', nullable: true }) html!: string | null;
  @CreatedAtColumn('received_at') receivedAt!: Date;
}
