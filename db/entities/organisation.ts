import { Column, Entity, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';
import type { Membership } from './membership';

/** A participating lab, or the PT provider itself. */
@Entity({ name: 'organisation' })
export class Organisation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text', default: 'lab' }) kind!: 'lab' | 'provider';
  @Column({ type: 'text', nullable: true }) country!: string | null;
  @Column({ type: 'text', name: 'contact_email', nullable: true }) contactEmail!: string | null;
  @CreatedAtColumn() createdAt!: Date;
  @OneToMany('Membership', (m: Membership) => m.organisation) memberships?: Membership[];
}
