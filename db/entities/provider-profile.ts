import { Column, Entity, PrimaryColumn } from 'typeorm';
import { UuidColumn } from './columns';

/** The PT provider's identity printed on every report, certificate and e-mail (one row, id 1). */
@Entity({ name: 'provider_profile' })
export class ProviderProfile {
  @PrimaryColumn({ type: 'integer', default: 1 }) id!: number;
  @Column({ type: 'text', default: '' }) name!: string;
  @Column({ type: 'text', default: '' }) address!: string;
  @Column({ type: 'text', name: 'contact_email', default: '' }) contactEmail!: string;
  @Column({ type: 'text', name: 'contact_phone', default: '' }) contactPhone!: string;
  @Column({ type: 'text', default: '' }) website!: string;
  @Column({ type: 'text', name: 'accreditation_body', default: '' }) accreditationBody!: string;
  @Column({ type: 'text', name: 'accreditation_number', default: '' }) accreditationNumber!: string;
  @Column({ type: 'text', name: 'authoriser_name', default: '' }) authoriserName!: string;
  @Column({ type: 'text', name: 'authoriser_role', default: '' }) authoriserRole!: string;
  @Column({ type: 'text', default: '' }) subcontracting!: string;
  @Column({ type: 'bytea', nullable: true, select: false }) logo!: Buffer | null;
  @Column({ type: 'text', name: 'logo_type', nullable: true }) logoType!:
    'image/png' | 'image/jpeg' | null;
  /** Tax rate on participation fees, basis points (billing). */
  @Column({ type: 'integer', name: 'tax_rate_bp', default: 0 }) taxRateBp!: number;
  @Column({ type: 'timestamptz', name: 'updated_at', default: () => 'now()' }) updatedAt!: Date;
  @UuidColumn('updated_by', { nullable: true }) updatedBy!: string | null;
}
