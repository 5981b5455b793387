import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One shipment of a release announced by its supplier (an ASN). */
@Entity('ship_notice')
export class ShipNoticeEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'release_id', type: 'integer' })
  releaseId: number;

  @Column({ name: 'ship_date', type: 'varchar', length: 10 })
  shipDate: string;

  /** Ship date plus the supplier's transit days, fixed when the notice arrives. */
  @Column({ name: 'arrival_date', type: 'varchar', length: 10 })
  arrivalDate: string;

  @Column({ type: 'varchar', length: 60 })
  carrier: string;

  @Column({ name: 'tracking_number', type: 'varchar', length: 60 })
  trackingNumber: string;

  @Column({ name: 'created_at', type: 'varchar', length: 30 })
  createdAt: string;

  /** Where this shipment's card stands on the dock board. */
  @Column({ name: 'dock_column', type: 'varchar', length: 12, default: 'expected' })
  dockColumn: string;

  /** `supplier:<code>` for a link, otherwise the signed-in account's e-mail. */
  @Column({ name: 'created_by', type: 'varchar', length: 200 })
  createdBy: string;
}
