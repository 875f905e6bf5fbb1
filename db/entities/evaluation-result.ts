import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** The stored record of one item × measurand of an evaluation, with everything to reproduce it. */
@Entity({ name: 'evaluation_result' })
export class EvaluationResult {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('evaluation_id') evaluationId!: string;
  @UuidColumn('test_item_id') testItemId!: string;
  @UuidColumn('measurand_id') measurandId!: string;
  @Column({ type: 'text', name: 'item_code' }) itemCode!: string;
  @Column({ type: 'text', name: 'measurand_key' }) measurandKey!: string;
  @Column({ type: 'integer' }) n!: number;
  @Column({ type: 'double precision', name: 'assigned_value', nullable: true }) assignedValue!:
    number | null;
  @Column({ type: 'double precision', name: 'u_assigned', nullable: true }) uAssigned!:
    number | null;
  @Column({ type: 'double precision', name: 'sigma_pt', nullable: true }) sigmaPt!: number | null;
  @Column({ type: 'text' }) method!: string;
  @Column({ type: 'jsonb', default: () => "'{}'" }) constants!: Record<string, unknown>;
  @Column({ type: 'integer', default: 0 }) iterations!: number;
  @Column({ type: 'jsonb', default: () => "'[]'" }) warnings!: string[];
  /** Replicates used: [{ code, values, uncertainty }]. */
  @Column({ type: 'jsonb', default: () => "'[]'" }) inputs!: unknown[];
  /** Per participant: result, replicate SD, scores, signal, hints (shared ParticipantScore). */
  @Column({ type: 'jsonb', default: () => "'[]'" }) participants!: unknown[];
}
