import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A packing slip photo or PDF kept with a release (and its receipt when known). */
@Entity('attachment')
export class AttachmentEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'release_id', type: 'integer' })
  releaseId: number;

  @Column({ name: 'receipt_id', type: 'integer', nullable: true })
  receiptId: number | null;

  @Column({ name: 'file_name', type: 'varchar', length: 200 })
  fileName: string;

  @Column({ name: 'mime_type', type: 'varchar', length: 100 })
  mimeType: string;

  @Column({ name: 'size_bytes', type: 'integer' })
  sizeBytes: number;

  @Column({ name: 'storage_path', type: 'varchar', length: 300 })
  storagePath: string;

  @Column({ name: 'uploaded_by', type: 'varchar', length: 254 })
  uploadedBy: string;

  @Column({ name: 'uploaded_at', type: 'varchar', length: 30 })
  uploadedAt: string;
}
