import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn, UuidColumn } from './columns';
import type { RoundState } from '../../shared/contracts/round-states';

/** One round of a scheme. Its state changes only through the round lifecycle service. */
@Entity({ name: 'round' })
export class Round {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('scheme_id') schemeId!: string;
  @Column({ type: 'text', unique: true }) code!: string;
  @Column({ type: 'text' }) title!: string;
  @Column({ type: 'text', default: 'pt' }) kind!: 'pt' | 'precision';
  @Column({ type: 'text', default: 'draft' }) state!: RoundState;
  @Column({ type: 'date', name: 'enrolment_closes_on', nullable: true }) enrolmentClosesOn!:
    string | null;
  @Column({ type: 'date', name: 'dispatch_on', nullable: true }) dispatchOn!: string | null;
  @Column({ type: 'timestamptz', name: 'results_due_at', nullable: true })
  resultsDueAt!: Date | null;
  /** Instructions for labs (Markdown-like plain text), safety cautions included by default. */
  @Column({ type: 'text', default: '' }) instructions!: string;
  /** The measuring temperature the protocol asks for, °C. */
  @Column({ type: 'double precision', name: 'protocol_temperature_c', default: 25 })
  protocolTemperatureC!: number;
  /** Participation fee in minor units (cents). */
  @Column({ type: 'integer', name: 'fee_minor', default: 0 }) feeMinor!: number;
  @Column({ type: 'text', default: 'EUR' }) currency!: string;
  @CreatedAtColumn() createdAt!: Date;
  @UpdatedAtColumn() updatedAt!: Date;
}
