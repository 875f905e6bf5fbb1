import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UuidColumn } from './columns';

/** A raw-data file attached to a submission; the bytes live in PostgreSQL. */
@Entity({ name: 'attachment' })
export class Attachment {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @UuidColumn('submission_id') submissionId!: string;
  @UuidColumn('test_item_id', { nullable: true }) testItemId!: string | null;
  @Column({ type: 'text', name: 'file_name' }) fileName!: string;
  /** Detected from the content, never taken from the client. */
  @Column({ type: 'text', name: 'content_type' }) contentType!: string;
  @Column({ type: 'text' }) kind!: 'correlation-csv' | 'text' | 'pdf' | 'xlsx';
  @Column({ type: 'integer', name: 'size_bytes' }) sizeBytes!: number;
  @Column({ type: 'text' }) sha256!: string;
  @Column({ type: 'bytea', select: false }) data!: Buffer;
  /** shared/contracts/bench Reanalysis (correlation CSVs only). */
  @Column({ type: 'jsonb', nullable: true }) reanalysis!: Record<string, unknown> | null;
  @UuidColumn('uploaded_by', { nullable: true }) uploadedBy!: string | null;
  @CreatedAtColumn('uploaded_at') uploadedAt!: Date;
}
