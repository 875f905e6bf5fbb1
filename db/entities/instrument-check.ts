import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** A lab's check of one instrument against a reference material (history per instrument). */
@Entity({ name: 'instrument_check' })
export class InstrumentCheck {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('organisation_id') organisationId!: string;
  @Column({ type: 'text' }) instrument!: string;
  @Column({ type: 'text' }) material!: string;
  @Column({ type: 'double precision', name: 'reference_value_nm' }) referenceValueNm!: number;
  @Column({ type: 'double precision', name: 'tolerance_nm' }) toleranceNm!: number;
  @Column({ type: 'double precision', name: 'pdi_limit' }) pdiLimit!: number;
  @Column({ type: 'double precision', name: 'set_point_c' }) setPointC!: number;
  @Column({ type: 'double precision', name: 'temperature_tolerance_c' })
  temperatureToleranceC!: number;
  @Column({ type: 'double precision', name: 'min_equilibration_min' }) minEquilibrationMin!: number;
  /** shared/contracts/bench InstrumentCheckRun[] */
  @Column({ type: 'jsonb' }) runs!: unknown[];
  @Column({ type: 'boolean' }) passed!: boolean;
  /** shared/bench InstrumentCheckVerdict */
  @Column({ type: 'jsonb' }) verdict!: Record<string, unknown>;
  @Column({ type: 'text', default: '' }) notes!: string;
  @Column({ type: 'timestamptz', name: 'checked_at' }) checkedAt!: Date;
  @UuidColumn('recorded_by', { nullable: true }) recordedBy!: string | null;
  @CreatedAtColumn() createdAt!: Date;
}
