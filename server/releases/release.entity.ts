import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One release per supplier per day (reference empty), plus one per supplier and order reference for
 * orders already open when the plant started with Cardloop; states draft → sent → confirmed | exception → shipped → partial → received, or cancelled. */
@Entity('release')
@Index('IDX_release_supplier_date_reference', ['supplierCode', 'releaseDate', 'reference'], { unique: true })
export class ReleaseEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index({ unique: true })
  @Column({ type: 'varchar', length: 30 })
  number: string;

  @Column({ name: 'supplier_code', type: 'varchar', length: 20 })
  supplierCode: string;

  @Column({ name: 'release_date', type: 'varchar', length: 10 })
  releaseDate: string;

  /** The order reference of an open order loaded at go-live; empty for the daily release. */
  @Column({ type: 'varchar', length: 40, default: '' })
  reference: string;

  @Column({ type: 'varchar', length: 12, default: 'draft' })
  status: string;

  @Column({ name: 'sent_at', type: 'varchar', length: 30, nullable: true })
  sentAt: string | null;

  @Column({ name: 'confirmed_at', type: 'varchar', length: 30, nullable: true })
  confirmedAt: string | null;

  @Column({ type: 'varchar', length: 60, nullable: true })
  carrier: string | null;

  @Column({ name: 'tracking_number', type: 'varchar', length: 60, nullable: true })
  trackingNumber: string | null;

  @Column({ name: 'supplier_note', type: 'text', nullable: true })
  supplierNote: string | null;
}
