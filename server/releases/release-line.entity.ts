import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('release_line')
export class ReleaseLineEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'release_id', type: 'integer' })
  releaseId: number;

  @Index()
  @Column({ name: 'part_number', type: 'varchar', length: 40 })
  partNumber: string;

  @Column({ type: 'double precision' })
  qty: number;

  @Column({ name: 'need_date', type: 'varchar', length: 10 })
  needDate: string;

  /** What the release first asked, kept when an accepted answer changes qty and need date: the scorecard measures against it. */
  @Column({ name: 'requested_qty', type: 'double precision', nullable: true })
  requestedQty: number | null;

  @Column({ name: 'requested_date', type: 'varchar', length: 10, nullable: true })
  requestedDate: string | null;

  /** Needed sooner than the supplier's lead time allows: only an expedite brings it in time. */
  @Column({ type: 'boolean', default: false })
  expedite: boolean;

  /** `kanban` when an empty card asked for it, `plan` when a planned release of a scheduled part did. */
  @Column({ type: 'varchar', length: 10 })
  origin: string;

  @Column({ name: 'card_id', type: 'integer', nullable: true })
  cardId: number | null;

  @Column({ name: 'confirmed_qty', type: 'double precision', nullable: true })
  confirmedQty: number | null;

  @Column({ name: 'ship_date', type: 'varchar', length: 10, nullable: true })
  shipDate: string | null;

  /** When the answered shipment arrives at our dock: ship date plus the supplier's transit days. */
  @Column({ name: 'arrival_date', type: 'varchar', length: 10, nullable: true })
  arrivalDate: string | null;

  @Column({ name: 'received_qty', type: 'double precision', default: 0 })
  receivedQty: number;

  @Column({ type: 'boolean', default: false })
  closed: boolean;

  /** Where the line's unshipped rest stands on the dock board (each shipment has its own column). */
  @Column({ name: 'dock_column', type: 'varchar', length: 12, default: 'expected' })
  dockColumn: string;
}
