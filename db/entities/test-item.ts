import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** A test item shipped to every participant of a round. */
@Entity({ name: 'test_item' })
export class TestItem {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('round_id') roundId!: string;
  @Column({ type: 'text' }) code!: string;
  @Column({ type: 'text' }) material!: string;
  @Column({ type: 'double precision', name: 'nominal_size_nm', nullable: true }) nominalSizeNm!:
    number | null;
  @Column({ type: 'text', name: 'storage_notes', default: '' }) storageNotes!: string;
  @Column({ type: 'text', name: 'handling_notes', default: '' }) handlingNotes!: string;
  @Column({ type: 'integer', default: 0 }) position!: number;
}
