import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One kanban loop per kanban part: a supplier loop or an in-plant supermarket loop. */
@Entity('kanban_loop')
export class KanbanLoopEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index({ unique: true })
  @Column({ name: 'part_number', type: 'varchar', length: 40 })
  partNumber: string;

  @Column({ type: 'varchar', length: 12, default: 'supplier' })
  kind: string;

  @Column({ name: 'container_qty', type: 'double precision' })
  containerQty: number;

  @Column({ name: 'safety_factor', type: 'double precision', default: 0 })
  safetyFactor: number;

  @Column({ name: 'safety_days', type: 'double precision', default: 0 })
  safetyDays: number;

  @Column({ name: 'safety_units', type: 'double precision', default: 0 })
  safetyUnits: number;

  /** Demand is averaged over this many working days of exploded demand from today. */
  @Column({ name: 'sizing_window_days', type: 'integer', default: 20 })
  sizingWindowDays: number;
}
