import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** What is measured on each item of a round, with its scoring rules. */
@Entity({ name: 'measurand' })
export class Measurand {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  /** Stable key used in files and APIs: 'z_average', 'pdi', or a coordinator's own. */
  @Column({ type: 'text' }) key!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text' }) unit!: string;
  @Column({ type: 'integer' }) decimals!: number;
  @Column({ type: 'integer', name: 'replicates_required' }) replicatesRequired!: number;
  /** shared/stats SigmaPtRule as JSON. */
  @Column({ type: 'jsonb', name: 'sigma_pt_rule' }) sigmaPtRule!: Record<string, unknown>;
  /** Assigned-value rule as JSON: consensus (Algorithm A), reference value, or median. */
  @Column({ type: 'jsonb', name: 'assigned_value_rule' }) assignedValueRule!: Record<
    string,
    unknown
  >;
  @Column({ type: 'integer', name: 'min_participants', default: 12 }) minParticipants!: number;
  @Column({ type: 'integer', default: 0 }) position!: number;
}
