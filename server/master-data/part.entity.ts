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

  /** UN number of a dangerous good (four digits, e.g. 2794), null when it has none. */
  @Column({ name: 'un_number', type: 'varchar', length: 6, nullable: true })
  unNumber: string | null;

  /** Dangerous-goods hazard class or division (e.g. 8, 2.1). */
  @Column({ name: 'hazard_class', type: 'varchar', length: 10, nullable: true })
  hazardClass: string | null;

  /** Link to the part's safety data sheet. */
  @Column({ name: 'sds_url', type: 'varchar', length: 500, nullable: true })
  sdsUrl: string | null;

  @Column({ name: 'unit_weight_kg', type: 'double precision', nullable: true })
  unitWeightKg: number | null;

  /** One piece is too heavy to lift by hand alone: use the lifting aid the plant prescribes. */
  @Column({ name: 'heavy_lift', type: 'boolean', default: false })
  heavyLift: boolean;

  /** When stock of this part was last counted (a count or an on-hand import); null when never. */
  @Column({ name: 'last_counted_at', type: 'varchar', length: 30, nullable: true })
  lastCountedAt: string | null;
}
