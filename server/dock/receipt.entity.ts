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

  /** keep or return: the clerk's choice for a count over the supplier's tolerance; null otherwise. */
  @Column({ name: 'over_action', type: 'varchar', length: 8, nullable: true })
  overAction: string | null;

  /** Of qty, what lay above the line's ordered quantity when the count was over; 0 otherwise. */
  @Column({ name: 'excess_qty', type: 'double precision', default: 0 })
  excessQty: number;

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
