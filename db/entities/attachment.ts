import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A raw-data file attached to a submission; the bytes live in PostgreSQL. */
@Entity({ name: 'attachment' })
export class Attachment {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'submission_id' }) submissionId!: string;
  @Column({ type: 'uuid', name: 'test_item_id', nullable: true }) testItemId!: string | null;
  @Column({ type: 'text', name: 'file_name' }) fileName!: string;
  /** Detected from the content, never taken from the client. */
  @Column({ type: 'text', name: 'content_type' }) contentType!: string;
  @Column({ type: 'text' }) kind!: 'correlation-csv' | 'text' | 'pdf' | 'xlsx';
  @Column({ type: 'integer', name: 'size_bytes' }) sizeBytes!: number;
  @Column({ type: 'text' }) sha256!: string;
  @Column({ type: 'bytea', select: false }) data!: Buffer;
  /** shared/contracts/bench Reanalysis (correlation CSVs only). */
  @Column({ type: 'jsonb', nullable: true }) reanalysis!: Record<string, unknown> | null;
  @Column({ type: 'uuid', name: 'uploaded_by', nullable: true }) uploadedBy!: string | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'uploaded_at' }) uploadedAt!: Date;
}
