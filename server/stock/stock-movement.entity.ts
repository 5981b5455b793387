import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One change of a part's on-hand; the part's on-hand is the sum of its movements. */
@Entity('stock_movement')
@Index(['partNumber', 'id'])
@Index(['refType', 'ref'])
export class StockMovementEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'part_number', type: 'varchar', length: 40 })
  partNumber: string;

  /** Signed: positive adds to on-hand (receipt, count found more), negative takes away (backflush, scrap). */
  @Column({ type: 'double precision' })
  qty: number;

  /** opening, receipt, backflush, build-reversal, scrap, count, return */
  @Column({ type: 'varchar', length: 16 })
  kind: string;

  @Index()
  @Column({ type: 'varchar', length: 30 })
  at: string;

  @Column({ name: 'user_email', type: 'varchar', length: 254, nullable: true })
  userEmail: string | null;

  @Column({ type: 'varchar', length: 200, nullable: true })
  reason: string | null;

  /** What the movement belongs to: release (its number), serial, count. */
  @Column({ name: 'ref_type', type: 'varchar', length: 16, nullable: true })
  refType: string | null;

  @Column({ type: 'varchar', length: 80, nullable: true })
  ref: string | null;

  /** The part's on-hand right after this movement. */
  @Column({ name: 'balance_after', type: 'double precision' })
  balanceAfter: number;
}
