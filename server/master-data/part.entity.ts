import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('part')
export class PartEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index({ unique: true })
  @Column({ name: 'part_number', type: 'varchar', length: 40 })
  partNumber: string;

  @Column({ type: 'varchar', length: 200 })
  description: string;

  /** UN/ECE Recommendation 20 unit code (H87 piece, KGM, MTR, LTR…). */
  @Column({ type: 'varchar', length: 3, default: 'H87' })
  uom: string;

  @Column({ type: 'varchar', length: 10 })
  source: string;

  @Index()
  @Column({ name: 'supplier_code', type: 'varchar', length: 20, nullable: true })
  supplierCode: string | null;

  @Column({ name: 'lead_time_days', type: 'integer', default: 0 })
  leadTimeDays: number;

  @Column({ name: 'pack_qty', type: 'double precision', default: 1 })
  packQty: number;

  /** The sum of the part's stock movements, kept here for planning; changed only by the ledger. */
  @Column({ name: 'on_hand', type: 'double precision', default: 0 })
  onHand: number;

  @Column({ type: 'varchar', length: 10, nullable: true })
  replenishment: string | null;

  @Column({ name: 'safety_stock', type: 'double precision', default: 0 })
  safetyStock: number;

  @Column({ name: 'point_of_use', type: 'varchar', length: 40, nullable: true })
  pointOfUse: string | null;

  @Column({ type: 'boolean', default: false })
  hazardous: boolean;

  /** When stock of this part was last counted (a count or an on-hand import); null when never. */
  @Column({ name: 'last_counted_at', type: 'varchar', length: 30, nullable: true })
  lastCountedAt: string | null;
}
