import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One parent–component line; effectivity dates are inclusive, null means open-ended. */
@Entity('bom_line')
@Index(['parent', 'component', 'effectiveFrom'], { unique: true })
export class BomLineEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ type: 'varchar', length: 40 })
  parent: string;

  @Column({ type: 'varchar', length: 40 })
  component: string;

  @Column({ name: 'qty_per', type: 'double precision' })
  qtyPer: number;

  @Column({ name: 'scrap_pct', type: 'double precision', default: 0 })
  scrapPct: number;

  @Column({ name: 'effective_from', type: 'varchar', length: 10, nullable: true })
  effectiveFrom: string | null;

  @Column({ name: 'effective_to', type: 'varchar', length: 10, nullable: true })
  effectiveTo: string | null;
}
