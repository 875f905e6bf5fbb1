import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One reminder e-mail sent (the unique constraint makes "send once" hold across instances). */
@Entity({ name: 'reminder_log' })
export class ReminderLog {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'round_id' }) roundId!: string;
  @Column({ type: 'uuid', name: 'enrolment_id' }) enrolmentId!: string;
  @Column({ type: 'text' }) kind!: 'due-soon' | 'overdue';
  @CreateDateColumn({ type: 'timestamptz', name: 'sent_at' }) sentAt!: Date;
}
