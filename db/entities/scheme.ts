import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';

/** A PT scheme (e.g. nanoparticle sizing by DLS): the frame that rounds repeat. */
@Entity({ name: 'scheme' })
export class Scheme {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text', unique: true }) code!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text', default: '' }) description!: string;
  /** Measurand templates new rounds start from (shared/contracts MeasurandInput[]). */
  @Column({ type: 'jsonb', name: 'default_measurands', default: () => "'[]'" })
  defaultMeasurands!: unknown[];
  /** Free-form scheme rules shown to labs (participation, confidentiality, scoring). */
  @Column({ type: 'text', default: '' }) rules!: string;
  @CreatedAtColumn() createdAt!: Date;
}
