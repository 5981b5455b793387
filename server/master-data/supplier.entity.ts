import { Column, Entity, Index, PrimaryGeneratedColumn, type ValueTransformer } from 'typeorm';

const weekdaysColumn: ValueTransformer = {
  to: (days: number[] | undefined) => (days === undefined ? undefined : days.join(',')),
  from: (stored: string | null) => (stored ? stored.split(',').map(Number) : []),
};

@Entity('supplier')
export class SupplierEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index({ unique: true })
  @Column({ type: 'varchar', length: 20 })
  code: string;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 254 })
  email: string;

  @Column({ name: 'lead_time_days', type: 'integer', default: 0 })
  leadTimeDays: number;

  /** Working days from shipping to arrival at our dock. */
  @Column({ name: 'transit_days', type: 'integer', default: 0 })
  transitDays: number;

  /** ISO weekdays the supplier delivers on, stored as "1,4"; empty means every working day. */
  @Column({ name: 'delivery_weekdays', type: 'varchar', length: 20, default: '', transformer: weekdaysColumn })
  deliveryWeekdays: number[];

  /** Delivery cycle days–deliveries–delay (delay counted in deliveries); all null when derived from the lead time. */
  @Column({ name: 'cycle_days', type: 'integer', nullable: true })
  cycleDays: number | null;

  @Column({ name: 'deliveries_per_cycle', type: 'integer', nullable: true })
  deliveriesPerCycle: number | null;

  @Column({ name: 'delivery_delay', type: 'integer', nullable: true })
  deliveryDelay: number | null;

  /** How much more than a line asks the supplier may deliver without the clerk deciding, in per cent. */
  @Column({ name: 'over_tolerance_pct', type: 'double precision', default: 0 })
  overTolerancePct: number;

  /** The on-time window around the requested arrival date, in working days. */
  @Column({ name: 'early_tolerance_days', type: 'integer', default: 1 })
  earlyToleranceDays: number;

  @Column({ name: 'late_tolerance_days', type: 'integer', default: 0 })
  lateToleranceDays: number;
}
