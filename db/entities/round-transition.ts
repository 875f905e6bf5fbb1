import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';
import type { RoundState } from '../../shared/contracts/round-states';

/** A recorded state change of a round (also in the audit trail). */
@Entity({ name: 'round_transition' })
export class RoundTransition {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @Column({ type: 'text', name: 'from_state' }) fromState!: RoundState;
  @Column({ type: 'text', name: 'to_state' }) toState!: RoundState;
  @UuidColumn('actor_id', { nullable: true }) actorId!: string | null;
  @Column({ type: 'text', nullable: true }) reason!: string | null;
  @Column({ type: 'boolean', default: false }) forced!: boolean;
  @CreatedAtColumn('at') at!: Date;
}
