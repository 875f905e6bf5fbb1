import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** One reminder e-mail sent (the unique constraint makes "send once" hold across instances). */
@Entity({ name: 'reminder_log' })
export class ReminderLog {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @UuidColumn('enrolment_id') enrolmentId!: string;
  @Column({ type: 'text' }) kind!: 'due-soon' | 'overdue';
  @CreatedAtColumn('sent_at') sentAt!: Date;
}
