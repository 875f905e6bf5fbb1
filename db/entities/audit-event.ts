import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** Append-only audit trail: a database trigger refuses UPDATE and DELETE. */
@Entity({ name: 'audit_event' })
export class AuditEvent {
  @PrimaryGeneratedColumn('increment', { type: 'bigint' }) id!: string;
  @CreatedAtColumn('at') at!: Date;
  @UuidColumn('actor_id', { nullable: true }) actorId!: string | null;
  @Column({ type: 'text' }) action!: string;
  @Column({ type: 'text', name: 'subject_type' }) subjectType!: string;
  @Column({ type: 'text', name: 'subject_id', nullable: true }) subjectId!: string | null;
  @Column({ type: 'jsonb', default: () => "'{}'" }) details!: Record<string, unknown>;
}
