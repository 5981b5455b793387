import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * Kept excess of an over receipt applied to another open line of the same part and supplier: the
 * line's received quantity grew by `qty`, and the scorecard counts it as delivered on that line.
 */
@Entity('receipt_share')
export class ReceiptShareEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'receipt_id', type: 'integer' })
  receiptId: number;

  @Index()
  @Column({ name: 'release_line_id', type: 'integer' })
  releaseLineId: number;

  @Column({ type: 'double precision' })
  qty: number;

  /** When the line was expected at the dock at the time. */
  @Column({ type: 'varchar', length: 10 })
  due: string;

  /** The share covered all that was still to come, and the line closed. */
  @Column({ type: 'boolean', default: false })
  closed: boolean;
}
