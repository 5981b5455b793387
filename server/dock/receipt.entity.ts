import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('receipt')
export class ReceiptEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'release_line_id', type: 'integer' })
  releaseLineId: number;

  @Column({ type: 'double precision' })
  qty: number;

  /** The shipment this count belongs to; null for goods that came without a ship notice. */
  @Column({ name: 'ship_notice_id', type: 'integer', nullable: true })
  shipNoticeId: number | null;

  /** short, over, damaged or wrong_part; null when the count matched. */
  @Column({ type: 'varchar', length: 12, nullable: true })
  discrepancy: string | null;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  /** The clerk marked this receipt final: its line closed even if less than ordered arrived. */
  @Column({ type: 'boolean', default: false })
  final: boolean;

  /** Replaying a request with the same key returns the first result and counts nothing twice. */
  @Index({ unique: true })
  @Column({ name: 'idempotency_key', type: 'varchar', length: 100 })
  idempotencyKey: string;

  @Column({ name: 'on_hand_after', type: 'double precision' })
  onHandAfter: number;

  @Column({ name: 'user_email', type: 'varchar', length: 254 })
  userEmail: string;

  @Column({ name: 'received_at', type: 'varchar', length: 30 })
  receivedAt: string;
}
