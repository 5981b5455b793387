import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

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

  /** Delivery cycle written days–deliveries–delay: `deliveriesPerCycle` drops every `cycleDays`, each arriving `deliveryDelay` cycles after its signal. */
  @Column({ name: 'cycle_days', type: 'integer', default: 1 })
  cycleDays: number;

  @Column({ name: 'deliveries_per_cycle', type: 'integer', default: 1 })
  deliveriesPerCycle: number;

  @Column({ name: 'delivery_delay', type: 'integer', default: 1 })
  deliveryDelay: number;
}
