import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** How much of one release line travels on one ship notice. */
@Entity('ship_notice_line')
export class ShipNoticeLineEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'ship_notice_id', type: 'integer' })
  shipNoticeId: number;

  @Index()
  @Column({ name: 'release_line_id', type: 'integer' })
  releaseLineId: number;

  @Column({ type: 'double precision' })
  qty: number;
}
