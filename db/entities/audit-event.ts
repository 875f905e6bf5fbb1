import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** Append-only audit trail: a database trigger refuses UPDATE and DELETE. */
@Entity({ name: 'audit_event' })
export class AuditEvent {
  @PrimaryGeneratedColumn('increment', { type: 'bigint' }) id!: string;
  @CreateDateColumn({ type: 'timestamptz', name: 'at' }) at!: Date;
  @Column({ type: 'uuid', name: 'actor_id', nullable: true }) actorId!: string | null;
  @Column({ type: 'text' }) action!: string;
  @Column({ type: 'text', name: 'subject_type' }) subjectType!: string;
  @Column({ type: 'text', name: 'subject_id', nullable: true }) subjectId!: string | null;
  @Column({ type: 'jsonb', default: () => "'{}'" }) details!: Record<string, unknown>;
}
